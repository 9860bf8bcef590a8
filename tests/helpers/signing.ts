import type { SamlTestDriver } from './saml-round-trip';
import { reauthenticate } from './saml-round-trip';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

/** Prepares, re-authenticates and signs one record as the given person, through the real API. */
export async function signThroughApi(
  saml: SamlTestDriver,
  signer: { agent: Agent; csrf: string; subject: string },
  intent: { recordType: string; recordId: string; meaning: string },
  reason?: string,
) {
  const preparation = await signer.agent
    .post('/api/signatures/preparations')
    .set('X-CSRF-Token', signer.csrf)
    .send(intent);
  if (preparation.status !== 200) return preparation;
  return signer.agent
    .post('/api/signatures')
    .set('X-CSRF-Token', signer.csrf)
    .send({
      ...intent,
      contentHash: preparation.body.contentHash,
      ...(preparation.body.trailThroughSeq === null ? {} : { trailThroughSeq: preparation.body.trailThroughSeq }),
      reason,
      reauthenticationId: await reauthenticate(saml, signer.agent, signer.subject, preparation.body.bindingHash),
    });
}
