import { AsyncLocalStorage } from 'node:async_hooks';
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { CookieOptions } from 'express';

/**
 * Binds a sign-in to the browser that started it (against login CSRF): starting a sign-in sets a
 * random, short-lived, HttpOnly cookie, and the AuthnRequest's ID is derived from it. The ACS
 * accepts a response only when its InResponseTo is the ID this browser's cookie gives, so a
 * response obtained in one browser and posted from another is refused.
 */
export const SIGN_IN_BINDING_COOKIE = 'ingotrace_signin';
const LIFETIME_MS = 10 * 60_000;
const context = new AsyncLocalStorage<{ nonce: string }>();

export const newBindingNonce = (): string => randomBytes(24).toString('base64url');

/** The AuthnRequest ID for this nonce: an xs:ID (starts with "_") nobody can derive without the secret. */
export function boundRequestId(nonce: string, secret: string): string {
  return `_${createHmac('sha256', secret).update(`sign-in:${nonce}`).digest('hex')}`;
}

/** Runs the building of an AuthnRequest so that its ID comes from this browser's nonce. */
export function withBindingNonce<T>(nonce: string, build: () => T): T {
  return context.run({ nonce }, build);
}

/** node-saml's ID generator: bound when a sign-in is being started, random otherwise (re-authentication). */
export function requestIdGenerator(secret: string): () => string {
  return () => {
    const store = context.getStore();
    return store ? boundRequestId(store.nonce, secret) : `_${randomBytes(20).toString('hex')}`;
  };
}

/** The binding nonce this browser sent, or null. */
export function bindingNonceFrom(cookieHeader: string | undefined): string | null {
  const match = new RegExp(`(?:^|;\\s*)${SIGN_IN_BINDING_COOKIE}=([A-Za-z0-9_-]{32})(?:;|$)`).exec(cookieHeader ?? '');
  return match ? match[1]! : null;
}

export function isBoundToThisBrowser(inResponseTo: string | null, nonce: string | null, secret: string): boolean {
  if (!inResponseTo || !nonce) return false;
  const expected = Buffer.from(boundRequestId(nonce, secret));
  const actual = Buffer.from(inResponseTo);
  return expected.length === actual.length && timingSafeEqual(expected, actual);
}

/**
 * The identity provider posts its answer from its own site: over https the cookie must be
 * SameSite=None (and Secure) to come back with that post; over plain http (a local identity
 * provider on the same host) Lax does.
 */
export function bindingCookieOptions(publicUrl: string): CookieOptions {
  const secure = publicUrl.startsWith('https:');
  return { httpOnly: true, secure, sameSite: secure ? 'none' : 'lax', path: '/auth/saml', maxAge: LIFETIME_MS };
}

/** A SAML message with a document type declaration is refused before any XML parser sees it. */
export function carriesDoctype(samlMessageBase64: unknown): boolean {
  if (typeof samlMessageBase64 !== 'string') return false;
  return /<!DOCTYPE/i.test(Buffer.from(samlMessageBase64, 'base64').toString('utf8'));
}
