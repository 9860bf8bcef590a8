import {
  createHash,
  createPrivateKey,
  createPublicKey,
  generateKeyPairSync,
  sign,
  verify,
  type KeyObject,
} from 'node:crypto';
import { chmodSync, existsSync, linkSync, mkdirSync, readFileSync, statSync, unlinkSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { loadConfig, type AppConfig } from '../../config/env';

/**
 * The Ed25519 key that signs every audit ledger event and every checkpoint. It lives in a file
 * outside the database, readable only by the app's user, so that whoever holds the app's
 * database account can append rows but cannot sign them. The public key is published beside it
 * (a .pub.pem file, in /api/audit/public-key and in every export) and is all a verifier needs.
 */
export interface LedgerSigner {
  keyId: string;
  publicKeyPem: string;
  /** Base64 Ed25519 signature of one event's chained hash. */
  signEvent(hash: string): string;
  /** Base64 Ed25519 signature of a checkpoint statement. */
  signStatement(statement: string): string;
}

export const eventStatement = (hash: string) => `ingotrace-ledger-event:${hash}`;

/**
 * The first 16 hex digits of the SHA-256 of the public key (DER, SPKI): short enough to read aloud, long enough to
 * compare.
 */
export function keyIdOf(publicKeyPem: string): string {
  return createHash('sha256')
    .update(createPublicKey(publicKeyPem).export({ type: 'spki', format: 'der' }))
    .digest('hex')
    .slice(0, 16);
}

export function verifyWithPublicKey(publicKeyPem: string, statement: string, signatureBase64: string): boolean {
  try {
    return verify(
      null,
      Buffer.from(statement, 'utf8'),
      createPublicKey(publicKeyPem),
      Buffer.from(signatureBase64, 'base64'),
    );
  } catch {
    return false;
  }
}

export const ledgerKeyPath = (config: Pick<AppConfig, 'LEDGER_KEY_FILE' | 'DATA_DIR'>) =>
  config.LEDGER_KEY_FILE ?? join(config.DATA_DIR, 'keys', 'ledger-signing-key.pem');
export const publicKeyPathOf = (keyPath: string) => keyPath.replace(/(\.pem)?$/, '.pub.pem');

/**
 * Creates the key file once, atomically (several app processes may start together), mode 600 in a folder of mode 700.
 */
function createKeyFile(path: string): void {
  mkdirSync(dirname(path), { recursive: true, mode: 0o700 });
  const { privateKey } = generateKeyPairSync('ed25519');
  const temporary = `${path}.${process.pid}.tmp`;
  writeFileSync(temporary, privateKey.export({ type: 'pkcs8', format: 'pem' }), { mode: 0o600 });
  try {
    linkSync(temporary, path);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
  } finally {
    unlinkSync(temporary);
  }
}

export function loadLedgerSigner(path: string): LedgerSigner {
  if (!existsSync(path)) createKeyFile(path);
  const mode = statSync(path).mode & 0o777;
  if (mode & 0o077)
    throw new Error(
      `The audit trail signing key ${path} can be read by other users (mode ${mode.toString(8)}); make it ` +
        `readable by the app's user only (chmod 600)`,
    );
  const privateKey: KeyObject = createPrivateKey(readFileSync(path, 'utf8'));
  if (privateKey.asymmetricKeyType !== 'ed25519')
    throw new Error(`The audit trail signing key ${path} is not an Ed25519 key`);
  const publicKeyPem = createPublicKey(privateKey).export({ type: 'spki', format: 'pem' }).toString();
  const publicPath = publicKeyPathOf(path);
  if (!existsSync(publicPath) || readFileSync(publicPath, 'utf8') !== publicKeyPem) {
    writeFileSync(publicPath, publicKeyPem, { mode: 0o644 });
    chmodSync(publicPath, 0o644);
  }
  return {
    keyId: keyIdOf(publicKeyPem),
    publicKeyPem,
    signEvent: (hash) => sign(null, Buffer.from(eventStatement(hash), 'utf8'), privateKey).toString('base64'),
    signStatement: (statement) => sign(null, Buffer.from(statement, 'utf8'), privateKey).toString('base64'),
  };
}

const signers = new Map<string, LedgerSigner>();
let defaultPath: string | null = null;

/** The signer of this installation (from the environment's configuration unless given), loaded once per key file. */
export function ledgerSigner(config?: Pick<AppConfig, 'LEDGER_KEY_FILE' | 'DATA_DIR'>): LedgerSigner {
  const path = config ? ledgerKeyPath(config) : (defaultPath ??= ledgerKeyPath(loadConfig()));
  let signer = signers.get(path);
  if (!signer) {
    signer = loadLedgerSigner(path);
    signers.set(path, signer);
  }
  return signer;
}

/**
 * This installation's public key for verifying, never creating a key: the published .pub.pem
 * beside the key file, else derived from the key file; an error when neither exists.
 */
export function installationPublicKey(config: Pick<AppConfig, 'LEDGER_KEY_FILE' | 'DATA_DIR'> = loadConfig()): string {
  const path = ledgerKeyPath(config);
  const publicPath = publicKeyPathOf(path);
  if (existsSync(publicPath)) return readFileSync(publicPath, 'utf8');
  if (existsSync(path)) return ledgerSigner(config).publicKeyPem;
  throw new Error(`No audit trail public key at ${publicPath}; give the firm's published key with --public-key`);
}
