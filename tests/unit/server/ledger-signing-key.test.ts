import { chmodSync, mkdtempSync, readFileSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  eventStatement,
  keyIdOf,
  loadLedgerSigner,
  publicKeyPathOf,
  verifyWithPublicKey,
} from '../../../server/src/modules/ledger/ledger-signing-key';

describe('the ledger signing key', () => {
  it(
    '[LEDGER-KEY-FILE] when first used, then an Ed25519 key is created readable by the app’s user only, with ' +
      'its public key published beside it',
    () => {
      const path = join(mkdtempSync(join(tmpdir(), 'ingotrace-key-')), 'keys', 'ledger-signing-key.pem');
      const signer = loadLedgerSigner(path);
      expect(statSync(path).mode & 0o777).toBe(0o600);
      expect(statSync(join(path, '..')).mode & 0o777).toBe(0o700);
      expect(readFileSync(publicKeyPathOf(path), 'utf8')).toBe(signer.publicKeyPem);
      expect(signer.keyId).toBe(keyIdOf(signer.publicKeyPem));
      // The same file gives the same key; a signature verifies with the public key alone, and not for another hash.
      expect(loadLedgerSigner(path).publicKeyPem).toBe(signer.publicKeyPem);
      const signature = signer.signEvent('a'.repeat(64));
      expect(verifyWithPublicKey(signer.publicKeyPem, eventStatement('a'.repeat(64)), signature)).toBe(true);
      expect(verifyWithPublicKey(signer.publicKeyPem, eventStatement('b'.repeat(64)), signature)).toBe(false);
    },
  );

  it('when the key file can be read by others, then the key is refused with what to do', () => {
    const path = join(mkdtempSync(join(tmpdir(), 'ingotrace-key-')), 'ledger-signing-key.pem');
    loadLedgerSigner(path);
    chmodSync(path, 0o644);
    expect(() => loadLedgerSigner(path)).toThrow(
      /can be read by other users \(mode 644\); make it readable by the app's user only \(chmod 600\)$/,
    );
  });
});
