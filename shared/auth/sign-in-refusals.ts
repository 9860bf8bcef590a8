/**
 * Why a sign-in was refused, as codes: the sign-in page shows the message the product chose for
 * the code, never text from the address bar. The detailed reason is in the audit trail.
 */
export const signInRefusalCodes = [
  'not-confirmed',
  'deactivated',
  'no-role',
  'role-combination',
  'other-browser',
  'too-many-attempts',
] as const;
export type SignInRefusalCode = (typeof signInRefusalCodes)[number];

export const signInRefusalMessages: Record<SignInRefusalCode, string> = {
  'not-confirmed':
    'The identity provider’s answer could not be accepted. Try again; if it keeps failing, tell your ' +
    'administrator (the reason is kept in the audit trail).',
  deactivated: 'Your Ingotrace account is deactivated; ask an administrator.',
  'no-role': 'You hold no Ingotrace role; ask an administrator to give you one.',
  'role-combination':
    'You hold roles that cannot be held together (Administrator and QA approver); ask an administrator to remove one.',
  'other-browser': 'This sign-in was started in another browser or window, or too long ago. Start again here.',
  'too-many-attempts': 'Too many sign-in attempts from this address; wait a few minutes and try again.',
};

export function signInRefusalMessage(code: unknown): string | null {
  return typeof code === 'string' && (signInRefusalCodes as readonly string[]).includes(code)
    ? signInRefusalMessages[code as SignInRefusalCode]
    : null;
}
