import type { QueryClient, QueryKey } from '@tanstack/vue-query';
import { auditKeys } from './audit';
import { barKeys } from './bar-stock';
import { homeKeys } from './home';
import { manufacturingKeys } from './manufacturing';
import { materialKeys } from './materials';
import { peopleKeys } from './people';
import { recallKeys } from './recall';
import { releaseKeys } from './release';
import { signatureKeys } from './signatures';

/**
 * What a change can make stale, in one place: each kind of change lists the queries whose answers
 * it may alter (every change also adds audit trail events, and lots feed the release checklist,
 * the trace and recall views). Composables and the signing dialog invalidate through this map only.
 */
export type ChangeKind = 'materials' | 'bar-stock' | 'manufacturing' | 'release' | 'recall' | 'people' | 'methods';

const trace: QueryKey = ['trace'];
// Every change may move a count of waiting work on a person's home.
const home: QueryKey = homeKeys.all;
const affects: Record<ChangeKind, readonly QueryKey[]> = {
  materials: [materialKeys.all, barKeys.all, releaseKeys.all, trace, auditKeys.all, home],
  'bar-stock': [barKeys.all, materialKeys.all, trace, auditKeys.all, home],
  manufacturing: [manufacturingKeys.all, barKeys.all, releaseKeys.all, recallKeys.all, trace, auditKeys.all, home],
  release: [releaseKeys.all, manufacturingKeys.all, recallKeys.all, trace, auditKeys.all, home],
  recall: [recallKeys.all, manufacturingKeys.all, releaseKeys.all, trace, auditKeys.all, home],
  people: [peopleKeys.all, auditKeys.all, home],
  methods: [manufacturingKeys.all, auditKeys.all, home],
};

/** Which change a signature on a record type is. */
export const changeOfRecordType: Record<string, ChangeKind> = {
  heat: 'materials',
  'heat-evaluation': 'materials',
  'specification-draft': 'materials',
  'heat-mixing': 'manufacturing',
  nonconformance: 'manufacturing',
  'lot-release': 'release',
  'lot-hold': 'recall',
  'recall-investigation': 'recall',
  'recall-notices': 'recall',
  'role-change': 'people',
  'ledger-review': 'release',
};

export async function invalidateAfter(queryClient: QueryClient, change: ChangeKind): Promise<void> {
  await Promise.all(affects[change].map((queryKey) => queryClient.invalidateQueries({ queryKey })));
}

/** After a signature: its record type's change, and the signature lists of that type. */
export async function invalidateAfterSignature(queryClient: QueryClient, recordType: string): Promise<void> {
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: signatureKeys.type(recordType) }),
    invalidateAfter(queryClient, changeOfRecordType[recordType] ?? 'manufacturing'),
  ]);
}
