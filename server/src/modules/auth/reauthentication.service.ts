import { randomBytes } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { reauthenticationRefusal, SIGNING_TICKET_LIFETIME_MS } from '@shared/auth/reauthentication-rules';
import type { Person } from '@shared/schemas/people';
import type { ReauthenticationStart, ReauthenticationStatus } from '@shared/schemas/reauthentication';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type RequestOrigin } from '../ledger/ledger.repository';
import { refundRateLimit } from '../../middleware/rate-limits';
import type { Reauthentication } from './entities/reauthentication.entity';
import {
  findPersonIdentity,
  findReauthentication,
  insertReauthentication,
  updateReauthentication,
} from './reauthentications.repository';

/** The limiter that counts re-authentications begun (me.router); a refused or cancelled one is given back. */
export const REAUTHENTICATION_START_LIMIT = 'reauthentication-start';

type ReauthenticationRow = Reauthentication;

const urlFor = (id: string) => `/auth/reauth/${id}`;

function statusOf(row: ReauthenticationRow, now = Date.now()): ReauthenticationStatus['status'] {
  if (row.usedAt) return 'used';
  if (row.refusedReason) return 'refused';
  if (row.confirmedAt)
    return now - new Date(row.confirmedAt).getTime() > SIGNING_TICKET_LIFETIME_MS ? 'expired' : 'confirmed';
  return now - new Date(row.startedAt).getTime() > SIGNING_TICKET_LIFETIME_MS ? 'expired' : 'pending';
}

export async function startReauthentication(
  dataSource: DataSource,
  person: Person,
  start: ReauthenticationStart,
): Promise<ReauthenticationStatus> {
  const id = randomBytes(16).toString('hex');
  await insertReauthentication(dataSource.manager, {
    id,
    personId: person.id,
    purpose: start.purpose,
    bindingHash: start.bindingHash,
    returnTo: start.returnTo,
    startedAt: new Date(),
  });
  return { id, status: 'pending', reason: null, url: urlFor(id) };
}

export async function reauthenticationStatus(
  dataSource: DataSource,
  id: string,
  person: Person,
): Promise<ReauthenticationStatus> {
  const row = await findReauthentication(dataSource.manager, id);
  if (!row || row.personId !== person.id) throw AppError.notFound('Re-authentication');
  return { id, status: statusOf(row), reason: row.refusedReason, url: urlFor(id) };
}

/** The person who started a pending re-authentication (to send them to the identity provider). */
export async function pendingReauthentication(dataSource: DataSource, id: string): Promise<ReauthenticationRow | null> {
  const row = await findReauthentication(dataSource.manager, id);
  return row && statusOf(row) === 'pending' ? row : null;
}

/** Records what the identity provider answered; returns where the browser goes next. */
export async function completeReauthentication(
  dataSource: DataSource,
  input: {
    id: string;
    assertedSubject: string | null;
    authnInstant: Date | null;
    failure: string | null;
    clockSkewMs: number;
    origin: RequestOrigin;
  },
): Promise<{ returnTo: string; refusedReason: string | null }> {
  return inTransaction(dataSource, async (manager) => {
    const row = await findReauthentication(manager, input.id, true);
    if (!row || statusOf(row) !== 'pending')
      throw AppError.rule('This re-authentication is unknown, expired or already completed; start the signature again');
    const person = await findPersonIdentity(manager, row.personId);
    const refusal =
      input.failure ??
      (input.assertedSubject && input.authnInstant && person
        ? reauthenticationRefusal({
            expectedSubject: person.subject,
            assertedSubject: input.assertedSubject,
            startedAt: new Date(row.startedAt),
            authnInstant: input.authnInstant,
            now: new Date(),
            clockSkewMs: input.clockSkewMs,
          })
        : 'The identity provider did not confirm who you are');
    if (refusal) {
      await updateReauthentication(manager, row.id, { refusedReason: refusal.slice(0, 300) });
      await refundRateLimit(manager, REAUTHENTICATION_START_LIMIT, `person-${row.personId}`);
    } else {
      await updateReauthentication(manager, row.id, { confirmedAt: new Date(), authnInstant: input.authnInstant });
    }
    await appendLedgerEvent(manager, {
      actor: { id: row.personId, name: person?.name ?? null, role: null },
      action: refusal ? 'signature.reauthentication-refused' : 'signature.reauthenticated',
      entity: { type: 'reauthentication', id: row.id },
      after: {
        purpose: row.purpose,
        bindingHash: row.bindingHash,
        authnInstant: input.authnInstant?.toISOString() ?? null,
      },
      reason: refusal,
      origin: input.origin,
    });
    return { returnTo: row.returnTo, refusedReason: refusal };
  });
}

/**
 * The person stops waiting for the password window: a pending re-authentication ends as cancelled and does not count
 * against their limit.
 */
export async function cancelReauthentication(
  dataSource: DataSource,
  id: string,
  person: Person,
  origin: RequestOrigin,
): Promise<ReauthenticationStatus> {
  return inTransaction(dataSource, async (manager) => {
    const row = await findReauthentication(manager, id, true);
    if (!row || row.personId !== person.id) throw AppError.notFound('Re-authentication');
    if (statusOf(row) !== 'pending') return { id, status: statusOf(row), reason: row.refusedReason, url: urlFor(id) };
    const reason = 'Cancelled by the person signing';
    await updateReauthentication(manager, row.id, { refusedReason: reason });
    await refundRateLimit(manager, REAUTHENTICATION_START_LIMIT, `person-${person.id}`);
    await appendLedgerEvent(manager, {
      actor: { id: person.id, name: person.name, role: null },
      action: 'signature.reauthentication-cancelled',
      entity: { type: 'reauthentication', id: row.id },
      after: { purpose: row.purpose },
      origin,
    });
    return { id, status: 'refused', reason, url: urlFor(id) };
  });
}

/**
 * Uses a confirmed re-authentication once, for the signature it was bound to, inside the
 * signature's own transaction. Throws a clear refusal otherwise.
 */
export async function consumeReauthentication(
  manager: EntityManager,
  input: { id: string; personId: number; bindingHash: string },
): Promise<{ authnInstant: Date }> {
  const row = await findReauthentication(manager, input.id, true);
  if (!row || row.personId !== input.personId)
    throw AppError.rule('Sign again: no re-authentication of yours matches this signature', {
      reauthenticationId: 'Unknown',
    });
  const status = statusOf(row);
  if (status !== 'confirmed') {
    const why = {
      pending: 'has not been completed',
      refused: `was refused (${row.refusedReason})`,
      used: 'was already used for a signature',
      expired: 'has expired',
    }[status];
    throw AppError.rule(`Sign again: the re-authentication ${why}`, { reauthenticationId: status });
  }
  if (row.bindingHash !== input.bindingHash)
    throw AppError.rule('Sign again: the record changed after you re-authenticated', {
      reauthenticationId: 'Bound to other content',
    });
  await updateReauthentication(manager, row.id, { usedAt: new Date() });
  return { authnInstant: new Date(row.authnInstant as Date) };
}
