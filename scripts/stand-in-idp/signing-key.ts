import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { generate } from 'selfsigned';

export interface SigningKey {
  privateKeyPem: string;
  certificatePem: string;
}

/** A fresh RSA key with a self-signed SHA-256 certificate (ten years). */
export async function createSigningKey(commonName: string): Promise<SigningKey> {
  const pems = await generate([{ name: 'commonName', value: commonName }], {
    keySize: 2048,
    algorithm: 'sha256',
    notAfterDate: new Date(Date.now() + 3650 * 24 * 3600 * 1000),
  });
  return { privateKeyPem: pems.private, certificatePem: pems.cert };
}

/**
 * The stand-in identity provider's signing key and certificate, created at first start and kept
 * beside the certificate file that the service provider trusts.
 */
export async function loadOrCreateSigningKey(certificateFile: string): Promise<SigningKey> {
  const keyFile = certificateFile.replace(/\.pem$/, '') + '.key.pem';
  if (existsSync(certificateFile) && existsSync(keyFile)) {
    return { privateKeyPem: readFileSync(keyFile, 'utf8'), certificatePem: readFileSync(certificateFile, 'utf8') };
  }
  const key = await createSigningKey('Ingotrace stand-in identity provider');
  mkdirSync(dirname(certificateFile), { recursive: true });
  writeFileSync(keyFile, key.privateKeyPem, { mode: 0o600 });
  writeFileSync(certificateFile, key.certificatePem);
  return key;
}
