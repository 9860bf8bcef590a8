import type { EntityManager } from 'typeorm';
import { OperationFile } from './entities/operation-file.entity';

/** The recorded step of the lot, with its routing step, locked for the rest of the transaction; or null. */
export async function lockOperationOfLot(
  manager: EntityManager,
  operationId: number,
  lotId: number,
): Promise<{ id: number; step_no: number; name: string } | null> {
  const [row] = await manager.query(
    `SELECT o.id, s.step_no, s.name FROM lot_operation o JOIN routing_step s ON s.id = o.routing_step_id
      WHERE o.id = ? AND o.lot_id = ? FOR UPDATE`,
    [operationId, lotId],
  );
  return row ?? null;
}

/** Attaches the stored document to the step unless it is attached already; true when this call attached it. */
export async function attachFileOnce(
  manager: EntityManager,
  file: Pick<OperationFile, 'operationId' | 'documentId' | 'name' | 'attachedBy'>,
): Promise<boolean> {
  const result = await manager
    .getRepository(OperationFile)
    .createQueryBuilder()
    .insert()
    .values(file)
    .orIgnore()
    // Without RETURNING, MariaDB's own count of rows written tells whether the row is new.
    .updateEntity(false)
    .execute();
  return (result.raw as { affectedRows: number }).affectedRows === 1;
}

/** A file attached to a recorded step of the lot, with its bytes; or null. */
export async function operationFileContent(
  manager: EntityManager,
  lotId: number,
  operationId: number,
  documentId: number,
): Promise<{ media_type: string; name: string; content: Buffer; sha256: string } | null> {
  const [row] = await manager.query(
    `SELECT d.media_type, f.name, d.content, d.sha256
       FROM operation_file f JOIN lot_operation o ON o.id = f.operation_id JOIN certificate_document d ON
         d.id = f.document_id
      WHERE o.lot_id = ? AND f.operation_id = ? AND f.document_id = ?`,
    [lotId, operationId, documentId],
  );
  return row ?? null;
}
