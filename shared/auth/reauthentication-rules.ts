/**
 * When a re-authentication for an electronic signature counts: the identity provider must have
 * authenticated the same person again after the request started, and recently.
 */
export const REAUTHENTICATION_MAX_AGE_MS = 2 * 60_000;
/** How long a confirmed re-authentication may wait for the signature it was for. */
export const SIGNING_TICKET_LIFETIME_MS = 5 * 60_000;

export function reauthenticationRefusal(input: {
  expectedSubject: string;
  assertedSubject: string;
  startedAt: Date;
  authnInstant: Date;
  now: Date;
  clockSkewMs: number;
}): string | null {
  if (input.assertedSubject !== input.expectedSubject)
    return 'Re-authentication was by a different person than the one signing';
  // SAML instants carry whole seconds; the start is compared at the same precision.
  const startSecond = Math.floor(input.startedAt.getTime() / 1000) * 1000;
  if (input.authnInstant.getTime() < startSecond - input.clockSkewMs)
    return 'The identity provider did not ask for your password again (stale authentication)';
  if (input.now.getTime() - input.authnInstant.getTime() > REAUTHENTICATION_MAX_AGE_MS + input.clockSkewMs)
    return 'The re-authentication is older than 2 minutes';
  return null;
}
