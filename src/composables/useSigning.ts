import { computed, ref } from 'vue';
import { useMutation, useQueryClient } from '@tanstack/vue-query';
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

interface SignRequest {
  prepared: SignaturePreparation;
  reason: string;
  popup: Window | null;
}

/**
 * The signing sequence: show exactly what will be signed, have the identity provider ask for the
 * password again in a small window, then record the signature bound to that re-authentication.
 */
export function useSigning() {
  const queryClient = useQueryClient();
  const step = ref<SigningStep>('loading');
  /** Why the last signature did not go through (the reason field's own message is in fieldErrors). */
  const refusal = ref<string | null>(null);
  const fieldErrors = ref<Record<string, string>>({});
  let cancelled = false;
  let current: { id: string; popup: Window | null } | null = null;

  const preparing = useMutation({
    mutationFn: prepareSignature,
    onMutate: () => (step.value = 'loading'),
    onSuccess: () => (step.value = 'review'),
    onError: () => (step.value = 'failed'),
  });

  const signing = useMutation({
    mutationFn: async ({ prepared, reason, popup }: SignRequest): Promise<Signature> => {
      const reauthentication = await startReauthentication(
        `${prepared.meaning}: ${prepared.title}`.slice(0, 300),
        prepared.bindingHash,
      );
      current = { id: reauthentication.id, popup };
      if (popup) popup.location.href = reauthentication.url;
      else window.open(reauthentication.url, 'ingotrace-reauthentication');
      await waitForReauthentication(reauthentication.id);
      step.value = 'submitting';
      return submitSignature({
        recordType: prepared.recordType,
        recordId: prepared.recordId,
        meaning: prepared.meaning,
        contentHash: prepared.contentHash,
        ...(prepared.trailThroughSeq === null ? {} : { trailThroughSeq: prepared.trailThroughSeq }),
        reauthenticationId: reauthentication.id,
        ...(reason.trim() ? { reason: reason.trim() } : {}),
      });
    },
    onMutate: () => {
      step.value = 'reauthenticating';
      cancelled = false;
      refusal.value = null;
    },
    onSuccess: async (_signature, { prepared }) => {
      step.value = 'signed';
      await invalidateAfterSignature(queryClient, prepared.recordType);
    },
    onError: (failure, { popup }) => {
      try {
        popup?.close();
      } catch {
        // see cancel()
      }
      refusal.value = failure instanceof Error ? failure.message : String(failure);
      fieldErrors.value = isApiError(failure) ? failure.fields : {};
      step.value = 'review';
    },
    onSettled: () => (current = null),
  });

  const preparation = computed(() => preparing.data.value ?? null);
  const signature = computed(() => signing.data.value ?? null);
  const error = computed(() =>
    preparing.error.value ? preparing.error.value.message : step.value === 'review' ? refusal.value : null,
  );

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

  /**
   * Stops waiting for the password window: the server ends the re-authentication (not counted against the person) and
   * the window is closed.
   */
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

  const prepare = (intent: SignatureIntent) => preparing.mutateAsync(intent).catch(() => undefined);

  async function sign(reason: string) {
    const prepared = preparation.value;
    if (!prepared) return;
    refusal.value = null;
    fieldErrors.value = {};
    if (prepared.reasonRequired && reason.trim().length < 3) {
      fieldErrors.value = { reason: 'A reason of at least 3 characters is required' };
      return;
    }
    // Opened now, inside the click, so that the browser does not block it.
    const popup = window.open('about:blank', 'ingotrace-reauthentication', 'width=560,height=720');
    await signing.mutateAsync({ prepared, reason, popup }).catch(() => undefined);
  }

  return { step, preparation, error, fieldErrors, signature, prepare, sign, cancel };
}
