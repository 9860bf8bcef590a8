import type { EntityManager } from 'typeorm';
import type { SignatureMeaning } from '@shared/domain/signatures';

export interface SignatureRow {
  id: string;
  record_type: string;
  record_id: string;
  meaning: SignatureMeaning;
  reason: string | null;
  signer_id: number;
  signer_name: string;
  signer_role: string;
  signed_at: Date;
  signed_at_text: string;
  content_hash: string;
  content_json: string;
  reauthentication_id: string;
  authn_instant: Date;
  withdraws_signature_id: string | null;
  ledger_seq: string;
}

export async function signaturesFor(
  manager: EntityManager,
  recordType: string,
  recordId: string,
): Promise<SignatureRow[]> {
  return manager.query('SELECT * FROM electronic_signature WHERE record_type = ? AND record_id = ? ORDER BY id', [
    recordType,
    recordId,
  ]);
}

export async function newestSignaturesOfType(
  manager: EntityManager,
  recordType: string,
  limit = 50,
): Promise<SignatureRow[]> {
  return manager.query('SELECT * FROM electronic_signature WHERE record_type = ? ORDER BY id DESC LIMIT ?', [
    recordType,
    limit,
  ]);
}

export async function insertSignature(manager: EntityManager, row: Omit<SignatureRow, 'id'>): Promise<number> {
  const result: { insertId: number } = await manager.query(
    `INSERT INTO electronic_signature (record_type, record_id, meaning, reason, signer_id, signer_name,
        signer_role, signed_at, signed_at_text,
       content_hash, content_json, reauthentication_id, authn_instant, withdraws_signature_id, ledger_seq)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    [
      row.record_type,
      row.record_id,
      row.meaning,
      row.reason,
      row.signer_id,
      row.signer_name,
      row.signer_role,
      row.signed_at,
      row.signed_at_text,
      row.content_hash,
      row.content_json,
      row.reauthentication_id,
      row.authn_instant,
      row.withdraws_signature_id,
      row.ledger_seq,
    ],
  );
  return Number(result.insertId);
}

/** Streams every signature in id order, a batch at a time (for verification). */
export async function* allSignatures(manager: EntityManager, batchSize = 2000): AsyncGenerator<SignatureRow> {
  let after = 0;
  for (;;) {
    const rows: SignatureRow[] = await manager.query(
      'SELECT * FROM electronic_signature WHERE id > ? ORDER BY id LIMIT ?',
      [after, batchSize],
    );
    if (rows.length === 0) return;
    for (const row of rows) yield row;
    after = Number(rows[rows.length - 1]!.id);
  }
}
