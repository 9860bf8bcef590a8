import { ref } from 'vue';
import { useQueryClient } from '@tanstack/vue-query';
import type { Signature, SignatureIntent, SignaturePreparation } from '@shared/schemas/signatures';
import { isApiError } from '../api/http';
import {
  cancelReauthentication,
  prepareSignature,
  reauthenticationStatus,
  startReauthentication,
  submitSignature,
} from '../api/signatures';
import { invalidateAfterSignature } from '../api/invalidation';

export type SigningStep = 'loading' | 'review' | 'reauthenticating' | 'submitting' | 'signed' | 'failed';

const POLL_MS = 800;
/** A little beyond the server's own five minutes for a pending re-authentication, which then reports it expired. */
const GIVE_UP_MS = 6 * 60_000;

class Cancelled extends Error {}

/**
 * The signing sequence: show exactly what will be signed, have the identity provider ask for the
 * password again in a small window, then record the signature bound to that re-authentication.
 */
export function useSigning() {
  const queryClient = useQueryClient();
  const step = ref<SigningStep>('loading');
  const preparation = ref<SignaturePreparation | null>(null);
  const error = ref<string | null>(null);
  const fieldErrors = ref<Record<string, string>>({});
  const signature = ref<Signature | null>(null);
  let cancelled = false;
  let current: { id: string; popup: Window | null } | null = null;

  async function prepare(intent: SignatureIntent) {
    step.value = 'loading';
    error.value = null;
    try {
      preparation.value = await prepareSignature(intent);
      step.value = 'review';
    } catch (failure) {
      error.value = failure instanceof Error ? failure.message : String(failure);
      step.value = 'failed';
    }
  }

  /**
   * Waits for the server's answer to the re-authentication. The window's own state is never
   * consulted: once it shows the identity provider (another origin), the browser reports it as
   * closed to this page, however long the person takes to type their password.
   */
  async function waitForReauthentication(id: string): Promise<void> {
    const deadline = Date.now() + GIVE_UP_MS;
    while (Date.now() < deadline) {
      await new Promise((done) => setTimeout(done, POLL_MS));
      if (cancelled) throw new Cancelled('You stopped the password confirmation; nothing was signed');
      const status = await reauthenticationStatus(id);
      if (status.status === 'confirmed') return;
      if (status.status !== 'pending') throw new Error(status.reason ?? `The re-authentication is ${status.status}`);
    }
    throw new Error('No password was entered in time; sign again');
  }

  /** Stops waiting for the password window: the server ends the re-authentication (not counted against the person) and the window is closed. */
  async function cancel() {
    cancelled = true;
    const waiting = current;
    if (!waiting) return;
    try {
      waiting.popup?.close();
    } catch {
      // A window on another origin may refuse; the server's answer decides anyway.
    }
    await cancelReauthentication(waiting.id).catch(() => undefined);
  }

  async function sign(reason: string) {
    const prepared = preparation.value;
    if (!prepared) return;
    error.value = null;
    fieldErrors.value = {};
    if (prepared.reasonRequired && reason.trim().length < 3) {
      fieldErrors.value = { reason: 'A reason of at least 3 characters is required' };
      return;
    }
    // Opened now, inside the click, so that the browser does not block it.
    const popup = window.open('about:blank', 'ingotrace-reauthentication', 'width=560,height=720');
    step.value = 'reauthenticating';
    cancelled = false;
    try {
      const reauthentication = await startReauthentication(
        `${prepared.meaning}: ${prepared.title}`.slice(0, 300),
        prepared.bindingHash,
      );
      current = { id: reauthentication.id, popup };
      if (popup) popup.location.href = reauthentication.url;
      else window.open(reauthentication.url, 'ingotrace-reauthentication');
      await waitForReauthentication(reauthentication.id);
      step.value = 'submitting';
      signature.value = await submitSignature({
        recordType: prepared.recordType,
        recordId: prepared.recordId,
        meaning: prepared.meaning,
        contentHash: prepared.contentHash,
        ...(prepared.trailThroughSeq === null ? {} : { trailThroughSeq: prepared.trailThroughSeq }),
        reauthenticationId: reauthentication.id,
        ...(reason.trim() ? { reason: reason.trim() } : {}),
      });
      step.value = 'signed';
      await invalidateAfterSignature(queryClient, prepared.recordType);
    } catch (failure) {
      try {
        popup?.close();
      } catch {
        // see cancel()
      }
      error.value = failure instanceof Error ? failure.message : String(failure);
      fieldErrors.value = isApiError(failure) ? failure.fields : {};
      step.value = 'review';
    } finally {
      current = null;
    }
  }

  return { step, preparation, error, fieldErrors, signature, prepare, sign, cancel };
}
