import { createHash } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { fileTypeFromBuffer } from 'file-type';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { safeFileName } from '../../middleware/single-file-upload';
import { refusePdfWithActiveContent } from '../../documents/pdf-active-content';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { storeDocument } from '../materials/heats.repository';
import { attachFileOnce, lockOperationOfLot, operationFileContent } from './operation-files.repository';

export const MEASUREMENT_FILE_MAX_BYTES = 10 * 1024 * 1024;
const binaryTypes = new Set(['application/pdf', 'image/png', 'image/jpeg']);

/**
 * A measurement file's type comes from its bytes: PDF, PNG or JPEG by their signatures, or CSV
 * and plain text when the bytes are valid UTF-8 without control characters and the name says
 * .csv or .txt. Anything else is refused, whatever its name.
 */
export async function inspectMeasurementFile(
  bytes: Buffer,
  originalName: string,
): Promise<{ mediaType: string; sha256: string; name: string }> {
  if (bytes.length === 0) throw new AppError('UNSUPPORTED_MEDIA_TYPE', 'The file is empty', { file: 'Empty file' });
  const name = safeFileName(originalName, 'measurements');
  const detected = await fileTypeFromBuffer(bytes);
  let mediaType: string | null = detected && binaryTypes.has(detected.mime) ? detected.mime : null;
  if (!detected && /\.(csv|txt)$/i.test(name)) {
    try {
      const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
      if (!/[\u0000-\u0008\u000e-\u001f\u007f]/.test(text))
        mediaType = name.toLowerCase().endsWith('.csv') ? 'text/csv' : 'text/plain';
    } catch {
      mediaType = null;
    }
  }
  if (!mediaType) {
    throw new AppError(
      'UNSUPPORTED_MEDIA_TYPE',
      `The file's content is not a PDF, PNG, JPEG, CSV or text ` +
        `file${detected ? ` (it looks like ${detected.mime})` : ''}, whatever its name says`,
      {
        file: 'Attach measurements as PDF, PNG, JPEG, CSV or text',
      },
    );
  }
  if (mediaType === 'application/pdf') await refusePdfWithActiveContent(bytes, 'file');
  return { mediaType, sha256: createHash('sha256').update(bytes).digest('hex'), name };
}

export async function attachOperationFile(
  dataSource: DataSource,
  lotId: number,
  operationId: number,
  file: { bytes: Buffer; originalName: string },
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  const inspected = await inspectMeasurementFile(file.bytes, file.originalName);
  return inTransaction(dataSource, async (manager) => {
    const operation = await lockOperationOfLot(manager, operationId, lotId);
    if (!operation) throw AppError.notFound('Operation');
    const document = await storeDocument(manager, {
      sha256: inspected.sha256,
      mediaType: inspected.mediaType,
      bytes: file.bytes,
      originalName: inspected.name,
      uploadedBy: person.id,
    });
    const attached = await attachFileOnce(manager, {
      operationId,
      documentId: document.id,
      name: inspected.name,
      attachedBy: person.id,
    });
    if (!attached)
      throw new AppError('CONFLICT', 'This file is already attached to the operation', { file: 'Already attached' });
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.operation-file-attached',
      entity: { type: 'lot', id: lotId },
      after: {
        operationId,
        step: `${operation.step_no} ${operation.name}`,
        documentId: document.id,
        sha256: inspected.sha256,
        mediaType: inspected.mediaType,
        name: inspected.name,
      },
      origin,
    });
    return { documentId: document.id, sha256: inspected.sha256, name: inspected.name, mediaType: inspected.mediaType };
  });
}

export async function operationFile(dataSource: DataSource, lotId: number, operationId: number, documentId: number) {
  const row = await operationFileContent(dataSource.manager, lotId, operationId, documentId);
  if (!row) throw AppError.notFound('File');
  return { mediaType: row.media_type, name: row.name, content: row.content, sha256: row.sha256 };
}
