import { ref } from 'vue';
import { useQueryClient } from '@tanstack/vue-query';
import type { Signature, SignatureIntent, SignaturePreparation } from '@shared/schemas/signatures';
import { isApiError } from '../api/http';
import { prepareSignature, reauthenticationStatus, signatureKeys, startReauthentication, submitSignature } from '../api/signatures';

export type SigningStep = 'loading' | 'review' | 'reauthenticating' | 'submitting' | 'signed' | 'failed';

const POLL_MS = 800;
const GIVE_UP_MS = 5 * 60_000;

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

  async function waitForReauthentication(id: string, popup: Window | null): Promise<void> {
    const deadline = Date.now() + GIVE_UP_MS;
    let closedChecks = 0;
    while (Date.now() < deadline) {
      await new Promise((done) => setTimeout(done, POLL_MS));
      const status = await reauthenticationStatus(id);
      if (status.status === 'confirmed') return;
      if (status.status !== 'pending') throw new Error(status.reason ?? `The re-authentication is ${status.status}`);
      // The window closes itself once the identity provider has answered; give the answer a
      // moment to be recorded before concluding that the person closed it.
      if (popup && popup.closed && ++closedChecks > 3) throw new Error('The sign-in window was closed before you confirmed your password');
    }
    throw new Error('No password was entered in time; sign again');
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
    try {
      const reauthentication = await startReauthentication(`${prepared.meaning}: ${prepared.title}`.slice(0, 300), prepared.bindingHash);
      if (popup) popup.location.href = reauthentication.url;
      else window.open(reauthentication.url, 'ingotrace-reauthentication');
      await waitForReauthentication(reauthentication.id, popup);
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
      await queryClient.invalidateQueries({ queryKey: signatureKeys.type(prepared.recordType) });
    } catch (failure) {
      if (popup && !popup.closed) popup.close();
      error.value = failure instanceof Error ? failure.message : String(failure);
      fieldErrors.value = isApiError(failure) ? failure.fields : {};
      step.value = 'review';
    }
  }

  return { step, preparation, error, fieldErrors, signature, prepare, sign };
}
