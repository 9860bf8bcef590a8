import { randomBytes } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { reauthenticationRefusal, SIGNING_TICKET_LIFETIME_MS } from '@shared/auth/reauthentication-rules';
import type { Person } from '@shared/schemas/people';
import type { ReauthenticationStart, ReauthenticationStatus } from '@shared/schemas/reauthentication';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type RequestOrigin } from '../ledger/ledger.repository';
import { refundRateLimit } from '../../middleware/rate-limits';

/** The limiter that counts re-authentications begun (me.router); a refused or cancelled one is given back. */
export const REAUTHENTICATION_START_LIMIT = 'reauthentication-start';

interface ReauthenticationRow {
  id: string;
  person_id: number;
  purpose: string;
  binding_hash: string;
  return_to: string;
  started_at: Date;
  confirmed_at: Date | null;
  authn_instant: Date | null;
  refused_reason: string | null;
  used_at: Date | null;
}

const urlFor = (id: string) => `/auth/reauth/${id}`;

function statusOf(row: ReauthenticationRow, now = Date.now()): ReauthenticationStatus['status'] {
  if (row.used_at) return 'used';
  if (row.refused_reason) return 'refused';
  if (row.confirmed_at)
    return now - new Date(row.confirmed_at).getTime() > SIGNING_TICKET_LIFETIME_MS ? 'expired' : 'confirmed';
  return now - new Date(row.started_at).getTime() > SIGNING_TICKET_LIFETIME_MS ? 'expired' : 'pending';
}

export async function startReauthentication(
  dataSource: DataSource,
  person: Person,
  start: ReauthenticationStart,
): Promise<ReauthenticationStatus> {
  const id = randomBytes(16).toString('hex');
  await dataSource.query(
    'INSERT INTO reauthentication (id, person_id, purpose, binding_hash, return_to, started_at) VALUES (?, ?, ?, ?, ?, ?)',
    [id, person.id, start.purpose, start.bindingHash, start.returnTo, new Date()],
  );
  return { id, status: 'pending', reason: null, url: urlFor(id) };
}

async function findRow(manager: EntityManager, id: string, lock = false): Promise<ReauthenticationRow | null> {
  const [row]: ReauthenticationRow[] = await manager.query(
    `SELECT * FROM reauthentication WHERE id = ?${lock ? ' FOR UPDATE' : ''}`,
    [id],
  );
  return row ?? null;
}

export async function reauthenticationStatus(
  dataSource: DataSource,
  id: string,
  person: Person,
): Promise<ReauthenticationStatus> {
  const row = await findRow(dataSource.manager, id);
  if (!row || row.person_id !== person.id) throw AppError.notFound('Re-authentication');
  return { id, status: statusOf(row), reason: row.refused_reason, url: urlFor(id) };
}

/** The person who started a pending re-authentication (to send them to the identity provider). */
export async function pendingReauthentication(dataSource: DataSource, id: string): Promise<ReauthenticationRow | null> {
  const row = await findRow(dataSource.manager, id);
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
    const row = await findRow(manager, input.id, true);
    if (!row || statusOf(row) !== 'pending')
      throw AppError.rule('This re-authentication is unknown, expired or already completed; start the signature again');
    const [person]: Array<{ subject: string; name: string }> = await manager.query(
      'SELECT subject, name FROM person WHERE id = ?',
      [row.person_id],
    );
    const refusal =
      input.failure ??
      (input.assertedSubject && input.authnInstant && person
        ? reauthenticationRefusal({
            expectedSubject: person.subject,
            assertedSubject: input.assertedSubject,
            startedAt: new Date(row.started_at),
            authnInstant: input.authnInstant,
            now: new Date(),
            clockSkewMs: input.clockSkewMs,
          })
        : 'The identity provider did not confirm who you are');
    if (refusal) {
      await manager.query('UPDATE reauthentication SET refused_reason = ? WHERE id = ?', [
        refusal.slice(0, 300),
        row.id,
      ]);
      await refundRateLimit(manager, REAUTHENTICATION_START_LIMIT, `person-${row.person_id}`);
    } else {
      await manager.query('UPDATE reauthentication SET confirmed_at = ?, authn_instant = ? WHERE id = ?', [
        new Date(),
        input.authnInstant,
        row.id,
      ]);
    }
    await appendLedgerEvent(manager, {
      actor: { id: row.person_id, name: person?.name ?? null, role: null },
      action: refusal ? 'signature.reauthentication-refused' : 'signature.reauthenticated',
      entity: { type: 'reauthentication', id: row.id },
      after: {
        purpose: row.purpose,
        bindingHash: row.binding_hash,
        authnInstant: input.authnInstant?.toISOString() ?? null,
      },
      reason: refusal,
      origin: input.origin,
    });
    return { returnTo: row.return_to, refusedReason: refusal };
  });
}

/** The person stops waiting for the password window: a pending re-authentication ends as cancelled and does not count against their limit. */
export async function cancelReauthentication(
  dataSource: DataSource,
  id: string,
  person: Person,
  origin: RequestOrigin,
): Promise<ReauthenticationStatus> {
  return inTransaction(dataSource, async (manager) => {
    const row = await findRow(manager, id, true);
    if (!row || row.person_id !== person.id) throw AppError.notFound('Re-authentication');
    if (statusOf(row) !== 'pending') return { id, status: statusOf(row), reason: row.refused_reason, url: urlFor(id) };
    const reason = 'Cancelled by the person signing';
    await manager.query('UPDATE reauthentication SET refused_reason = ? WHERE id = ?', [reason, row.id]);
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
  const row = await findRow(manager, input.id, true);
  if (!row || row.person_id !== input.personId)
    throw AppError.rule('Sign again: no re-authentication of yours matches this signature', {
      reauthenticationId: 'Unknown',
    });
  const status = statusOf(row);
  if (status !== 'confirmed') {
    const why = {
      pending: 'has not been completed',
      refused: `was refused (${row.refused_reason})`,
      used: 'was already used for a signature',
      expired: 'has expired',
    }[status];
    throw AppError.rule(`Sign again: the re-authentication ${why}`, { reauthenticationId: status });
  }
  if (row.binding_hash !== input.bindingHash)
    throw AppError.rule('Sign again: the record changed after you re-authenticated', {
      reauthenticationId: 'Bound to other content',
    });
  await manager.query('UPDATE reauthentication SET used_at = ? WHERE id = ?', [new Date(), row.id]);
  return { authnInstant: new Date(row.authn_instant as Date) };
}
