import { createHash } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import { AppError } from '../../errors';
import { safeFileName } from '../../middleware/single-file-upload';
import { refusePdfWithActiveContent } from '../../documents/pdf-active-content';

export const CERTIFICATE_MAX_BYTES = 10 * 1024 * 1024;
const accepted = new Map([
  ['application/pdf', 'PDF'],
  ['image/png', 'PNG'],
  ['image/jpeg', 'JPEG'],
]);

/**
 * Decides a certificate file's type from its bytes (never its name), refuses PDFs with active content, and hashes it.
 */
export async function inspectCertificateFile(
  bytes: Buffer,
  originalName: string,
): Promise<{ mediaType: string; sha256: string; name: string }> {
  if (bytes.length === 0)
    throw new AppError('UNSUPPORTED_MEDIA_TYPE', 'The file is empty', { certificate: 'Empty file' });
  const detected = await fileTypeFromBuffer(bytes);
  if (!detected || !accepted.has(detected.mime)) {
    throw new AppError(
      'UNSUPPORTED_MEDIA_TYPE',
      `The file's content is not a PDF, PNG or JPEG${detected ? ` (it looks like ${detected.mime})` : ''}, ` +
        `whatever its name says`,
      {
        certificate: 'Upload the certificate as PDF, PNG or JPEG',
      },
    );
  }
  if (detected.mime === 'application/pdf') await refusePdfWithActiveContent(bytes, 'certificate');
  const name = safeFileName(originalName, 'certificate');
  return { mediaType: detected.mime, sha256: createHash('sha256').update(bytes).digest('hex'), name };
}
