import type { DataSource, EntityManager } from 'typeorm';
import { canonicalJson } from '@shared/domain/ledger-hash';
import { compareDecimal } from '@shared/domain/materials/e29-rounding';
import type { ElementLimit, Specification } from '@shared/domain/materials/specification';
import type { SpecificationDraftInput, SpecificationDraftView } from '@shared/schemas/materials';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, sha256Hex, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import type { SignableRecordType } from '../signatures/signable-records';
import { currentSpecifications, storedSpecification } from './specification-library.repository';
import {
  draftRow,
  insertDraft,
  insertRevision,
  latestDraftRows,
  revisionTaken,
  setDraftStatus,
  type DraftRow,
} from './specification-drafts.repository';

const limitText = (limit: Pick<ElementLimit, 'min' | 'max'> | undefined) =>
  !limit
    ? '—'
    : limit.min !== undefined && limit.max !== undefined
      ? `${limit.min}–${limit.max}`
      : limit.max !== undefined
        ? `≤ ${limit.max}`
        : `≥ ${limit.min}`;

const toleranceText = (tolerance: NonNullable<ElementLimit['tolerance']>) =>
  [
    tolerance.under !== undefined ? `${tolerance.under} under` : '',
    tolerance.over !== undefined ? `${tolerance.over} over` : '',
  ]
    .filter(Boolean)
    .join(', ');

function changesOf(base: Specification, proposed: Specification): SpecificationDraftView['changes'] {
  const changes: SpecificationDraftView['changes'] = [];
  for (const grade of proposed.grades) {
    const baseGrade = base.grades.find((candidate) => candidate.grade === grade.grade);
    for (const limit of grade.chemistry) {
      const before = baseGrade?.chemistry.find((candidate) => candidate.element === limit.element);
      // A new source for the same value is a change too (e.g. an unconfirmed value now checked).
      if (limitText(before) !== limitText(limit) || before?.source.reference !== limit.source.reference)
        changes.push({
          grade: grade.grade,
          element: limit.element,
          from: limitText(before),
          to: limitText(limit),
          reference: limit.source.reference,
        });
    }
  }
  return changes;
}

async function toView(manager: EntityManager, row: DraftRow): Promise<SpecificationDraftView> {
  const base = await storedSpecification(manager, row.spec_id, row.base_revision);
  const proposed = JSON.parse(row.definition_json) as Specification;
  return {
    id: row.id,
    specId: row.spec_id,
    baseRevision: row.base_revision,
    revision: row.revision,
    note: row.note,
    status: row.status,
    createdBy: row.created_by_name,
    createdAt: new Date(row.created_at).toISOString(),
    changes: base ? changesOf(base, proposed) : [],
  };
}

export async function listDrafts(dataSource: DataSource): Promise<SpecificationDraftView[]> {
  const rows = await latestDraftRows(dataSource.manager);
  return Promise.all(rows.map((row) => toView(dataSource.manager, row)));
}

/** Proposes a new revision: the current one with the given chemistry limits changed, each naming its source. */
export async function draftRevision(
  dataSource: DataSource,
  input: SpecificationDraftInput,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<SpecificationDraftView> {
  return inTransaction(dataSource, async (manager) => {
    const current = (await currentSpecifications(manager)).find((candidate) => candidate.id === input.specId);
    if (!current) throw AppError.rule(`Unknown specification ${input.specId}`, { specId: 'Not in the library' });
    if (await revisionTaken(manager, current.id, input.revision))
      throw new AppError('CONFLICT', `Revision ${input.revision} of ${current.id} exists already`, {
        revision: 'Already used',
      });
    const proposed: Specification = JSON.parse(JSON.stringify(current));
    proposed.revision = input.revision;
    proposed.edition = input.edition;
    const fields: Record<string, string> = {};
    input.limits.forEach((change, index) => {
      const grade = proposed.grades.find((candidate) => candidate.grade === change.grade);
      if (!grade)
        return void (fields[`limits.${index}.grade`] = `${current.id} has no grade ${change.grade ?? '(none)'}`);
      if (change.min === undefined && change.max === undefined)
        return void (fields[`limits.${index}`] = 'Give a minimum, a maximum or both');
      if (change.min !== undefined && change.max !== undefined && compareDecimal(change.min, change.max) > 0)
        return void (fields[`limits.${index}`] = 'The minimum is above the maximum');
      const limit: ElementLimit = {
        element: change.element,
        ...(change.min !== undefined ? { min: change.min } : {}),
        ...(change.max !== undefined ? { max: change.max } : {}),
        source: { reference: change.reference, confidence: change.confidence },
      };
      const existing = grade.chemistry.findIndex((candidate) => candidate.element === change.element);
      const before = existing >= 0 ? grade.chemistry[existing]! : undefined;
      // A tolerance may depend on the limit (F67 Fe: 0.10 up to 0.25, 0.15 above), so a changed limit never keeps the
      // old one.
      const limitChanged = !before || limitText(before) !== limitText(limit);
      if (before?.tolerance && limitChanged && !change.tolerance) {
        return void (fields[`limits.${index}.tolerance`] =
          `The limit changes, so re-enter its product-analysis tolerance (was ${toleranceText(before.tolerance)})`);
      }
      const tolerance =
        change.tolerance && (change.tolerance.under !== undefined || change.tolerance.over !== undefined)
          ? change.tolerance
          : limitChanged
            ? undefined
            : before?.tolerance;
      const drafted: ElementLimit = {
        ...limit,
        ...(tolerance
          ? {
              tolerance: {
                ...(tolerance.under !== undefined ? { under: tolerance.under } : {}),
                ...(tolerance.over !== undefined ? { over: tolerance.over } : {}),
              },
            }
          : {}),
      };
      if (existing >= 0) grade.chemistry[existing] = drafted;
      else grade.chemistry.push(drafted);
    });
    if (Object.keys(fields).length) throw new AppError('VALIDATION_FAILED', 'Some limit changes are not valid', fields);
    const draftId = await insertDraft(manager, {
      specId: current.id,
      baseRevision: current.revision,
      revision: input.revision,
      definitionJson: canonicalJson(proposed),
      note: input.note,
      createdBy: person.id,
    });
    const view = await toView(manager, (await draftRow(manager, draftId))!);
    await appendLedgerEvent(manager, {
      actor,
      action: 'specification.revision-drafted',
      entity: { type: 'specification-draft', id: view.id },
      after: view,
      reason: input.note,
      origin,
    });
    return view;
  });
}

/** Approving a draft (a QA approver's signature, not by its author) stores it as an immutable revision. */
export const specificationDraftRecordType: SignableRecordType<{ status?: string }> = {
  type: 'specification-draft',
  label: 'specification revision',
  action: 'specifications.approve',
  readAction: 'materials.read',
  meanings: ['approved', 'rejected'],
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    const row = await draftRow(manager, Number(recordId));
    if (!row) return null;
    const view = await toView(manager, row);
    return {
      title: `${row.spec_id} revision ${row.revision} (replacing ${row.base_revision})`,
      content: {
        specification: row.spec_id,
        revision: row.revision,
        replaces: row.base_revision,
        note: row.note,
        changes: view.changes,
        definitionHash: sha256Hex(row.definition_json),
      },
      authorIds: [row.created_by],
      status: row.status,
    };
  },
  refusal({ record }) {
    return record.status === 'draft' ? null : `This draft is already ${record.status}`;
  },
  async afterSign(manager, { recordId, meaning, signer, reason }) {
    const row = await draftRow(manager, Number(recordId), true);
    if (!row) return;
    const status = meaning === 'approved' ? 'approved' : 'rejected';
    if (status === 'approved') {
      const definition = JSON.parse(row.definition_json) as Specification;
      await insertRevision(manager, {
        specId: row.spec_id,
        revision: row.revision,
        title: definition.title,
        edition: definition.edition,
        definitionJson: row.definition_json,
        definitionHash: sha256Hex(row.definition_json),
      });
    }
    await setDraftStatus(manager, row.id, status);
    await appendLedgerEvent(manager, {
      actor: { id: signer.id, name: signer.name, role: signer.role },
      action: status === 'approved' ? 'specification.revision-approved' : 'specification.revision-rejected',
      entity: { type: 'specification', id: `${row.spec_id} ${row.revision}` },
      after: { draftId: row.id, status },
      reason,
    });
  },
};
