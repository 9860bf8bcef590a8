import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/**
 * Reads rendered PDFs with tools that are not part of the product (Debian's poppler-utils,
 * zbar-tools and dmtx-utils), so a test sees what a person or a scanner would see.
 */
export function readPdf(pdf: Buffer): { text: string; qrCodes: string[]; dataMatrix: string[] } {
  const folder = mkdtempSync(join(tmpdir(), 'ingotrace-pdf-'));
  try {
    const file = join(folder, 'document.pdf');
    writeFileSync(file, pdf);
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
    execFileSync('pdftoppm', ['-png', '-r', '200', '-f', '1', '-l', '1', file, join(folder, 'page')]);
    const page = join(folder, 'page-1.png');
    // Both decoders exit non-zero when the page holds no symbol of their kind.
    const decoded = (command: string, args: string[], encoding: BufferEncoding) => {
      try {
        return execFileSync(command, args, { encoding, stdio: ['ignore', 'pipe', 'ignore'] });
      } catch {
        return '';
      }
    };
    const qr = decoded('zbarimg', ['-q', '--raw', '-Sdisable', '-Sqrcode.enable', page], 'utf8');
    const matrix = decoded('dmtxread', ['-n', '-N1', '-S2', '-m', '20000', page], 'latin1');
    return { text, qrCodes: qr.split('\n').filter(Boolean), dataMatrix: matrix.split('\n').filter(Boolean) };
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
