import type { ChainedEvent } from '@shared/domain/ledger-hash';
import { eventStatement, keyIdOf, verifyWithPublicKey } from './ledger-signing-key';

export interface SignedEvent extends ChainedEvent {
  signature: string | null;
  keyId: string | null;
}

type Broken = { seq: number; why: string };

/**
 * Checks the events' signatures in order with the public key alone. Every event must be signed
 * by that key, except events written before signing began, which the first signed event
 * (ledger.signing-started, naming the last of them) covers through the hash chain. A ledger in
 * which no event is signed fails: rewriting every row unsigned is not a way out.
 */
export class SignatureWalk {
  private readonly keyId: string;
  private firstUnsigned: number | null = null;
  private lastUnsigned: number | null = null;
  private firstSigned: number | null = null;
  signed = 0;

  constructor(private readonly publicKeyPem: string) {
    this.keyId = keyIdOf(publicKeyPem);
  }

  step(event: SignedEvent): Broken | null {
    const seq = event.content.seq;
    if (event.signature === null) {
      if (this.firstSigned !== null)
        return { seq, why: `it is not signed, although the audit trail is signed from event ${this.firstSigned} on` };
      this.firstUnsigned ??= seq;
      this.lastUnsigned = seq;
      return null;
    }
    if (event.keyId !== this.keyId)
      return {
        seq,
        why: `it is signed with another key (key ${event.keyId ?? 'unnamed'}, this audit trail's key is ${this.keyId})`,
      };
    if (!verifyWithPublicKey(this.publicKeyPem, eventStatement(event.hash), event.signature))
      return { seq, why: "its signature does not verify with the audit trail's public key" };
    this.signed += 1;
    if (this.firstSigned === null) {
      this.firstSigned = seq;
      const started =
        event.content.action === 'ledger.signing-started'
          ? (event.content.after as { unsignedThrough?: unknown } | null)?.unsignedThrough
          : undefined;
      if (this.lastUnsigned !== null && started !== this.lastUnsigned)
        return {
          seq: this.firstUnsigned!,
          why: 'it is not signed, and no signed ledger.signing-started event covers it',
        };
    }
    return null;
  }

  finish(): Broken | null {
    if (this.firstSigned === null && this.firstUnsigned !== null)
      return { seq: this.firstUnsigned, why: 'it is not signed (no event of this audit trail is signed)' };
    return null;
  }
}
