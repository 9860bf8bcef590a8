// Runs the stand-in identity provider on IDP_PORT (npm start and npm test start it).
import type { Server } from 'node:http';
import type { AppConfig } from '../../server/src/config/env';
import { createStandInIdp } from './app';
import { loadOrCreateSigningKey } from './signing-key';

export async function startStandInIdp(config: AppConfig): Promise<{ url: string; stop: () => Promise<void> }> {
  const key = await loadOrCreateSigningKey(config.SAML_IDP_CERT_FILE);
  const app = createStandInIdp({
    entityId: config.SAML_IDP_ENTITY_ID,
    audience: config.SAML_SP_ENTITY_ID,
    allowedAcsUrls: config.allowedAcsUrls,
    key,
  });
  const server: Server = await new Promise((resolve, reject) => {
    const listening = app.listen(config.IDP_PORT, '127.0.0.1', () => resolve(listening));
    listening.on('error', reject);
  });
  return {
    url: `http://127.0.0.1:${config.IDP_PORT}`,
    stop: () =>
      new Promise((done) => {
        server.close(() => done());
        server.closeAllConnections();
      }),
  };
}
