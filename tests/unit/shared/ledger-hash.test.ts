import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
  canonicalJson,
  firstBrokenEvent,
  GENESIS_HASH,
  ledgerHashInput,
  type ChainedEvent,
  type LedgerEventContent,
} from '@shared/domain/ledger-hash';

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

describe('canonical JSON (RFC 8785)', () => {
  it('when serialising the RFC 8785 §3.2.2 sample, then the output is the one printed in §3.2.4', () => {
    // Source: RFC 8785, JSON Canonicalization Scheme, sections 3.2.2 (input) and 3.2.4 (output).
    const input = JSON.parse(
      '{"numbers": [333333333.33333329, 1E30, 4.50, 2e-3, 0.000000000000000000000000001], "string": ' +
        '"\\u20ac$\\u000F\\u000aA\'\\u0042\\u0022\\u005c\\\\\\"\\/", "literals": [null, true, false]}',
    );
    expect(canonicalJson(input)).toBe(
      '{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],' +
        '"string":"€$\\u000f\\nA\'B\\"\\\\\\\\\\"/"}',
    );
  });

  it('when sorting property names, then they sort by UTF-16 code units as in RFC 8785 §3.2.3', () => {
    // Source: RFC 8785 §3.2.3, the property-sorting example and its expected order.
    const input = JSON.parse(
      '{"\\u20ac":"Euro Sign","\\r":"Carriage Return","\\ufb33":"Hebrew Letter Dalet With ' +
        'Dagesh","1":"One","\\ud83d\\ude00":"Emoji: Grinning Face","\\u0080":"Control","\\u00f6":"Latin Small ' +
        'Letter O With Diaeresis"}',
    );
    // Read the order from the text itself (a parsed object would put the key "1" first).
    const order = [...canonicalJson(input).matchAll(/:"([^"]+)"/g)].map((match) => match[1]);
    expect(order).toEqual([
      'Carriage Return',
      'One',
      'Control',
      'Latin Small Letter O With Diaeresis',
      'Euro Sign',
      'Emoji: Grinning Face',
      'Hebrew Letter Dalet With Dagesh',
    ]);
  });

  it('when serialising numbers, then they follow the ECMAScript rules listed in RFC 8785 Appendix B', () => {
    // Source: RFC 8785 Appendix B (IEEE 754 value → expected JSON text); a selection.
    const cases: Array<[number, string]> = [
      [0, '0'],
      [-0, '0'],
      [5e-324, '5e-324'],
      [1.7976931348623157e308, '1.7976931348623157e+308'],
      [9007199254740992, '9007199254740992'],
      [-9007199254740992, '-9007199254740992'],
      [295147905179352830000, '295147905179352830000'],
      [9.999999999999997e22, '9.999999999999997e+22'],
      [1e23, '1e+23'],
      [0.000001, '0.000001'],
      [9.999999999999997e-7, '9.999999999999997e-7'],
    ];
    for (const [value, expected] of cases) expect(canonicalJson(value)).toBe(expected);
  });
});

describe('the ledger hash chain', () => {
  const content = (seq: number, action: string): LedgerEventContent => ({
    seq,
    occurredAt: `2026-12-01T10:00:0${seq}.000Z`,
    actor: { id: 7, name: 'Maren Østby', role: 'manufacturing-engineer' },
    action,
    entity: { type: 'heat', id: 'H-1' },
    before: null,
    after: { status: action },
    reason: null,
    requestId: null,
    clientAddress: '127.0.0.1',
  });

  function chain(actions: string[]): ChainedEvent[] {
    let previous = GENESIS_HASH;
    return actions.map((action, index) => {
      const eventContent = content(index + 1, action);
      const hash = sha256(ledgerHashInput(previous, eventContent));
      const event = { content: eventContent, previousHash: previous, hash };
      previous = hash;
      return event;
    });
  }

  it('when nothing was changed, then the whole chain verifies', () => {
    expect(firstBrokenEvent(chain(['received', 'accepted', 'issued']), sha256)).toBeNull();
  });

  it('[LEDGER-HASH-CHANGE] when one event’s content is changed, then verification names exactly that event', () => {
    const events = chain(['received', 'accepted', 'issued']);
    events[1]!.content.after = { status: 'rejected' };
    expect(firstBrokenEvent(events, sha256)).toEqual({ seq: 2, why: 'its content no longer matches its hash' });
  });

  it('[LEDGER-HASH-GAP] when an event is removed, then the gap is named', () => {
    const events = chain(['received', 'accepted', 'issued']);
    expect(firstBrokenEvent([events[0]!, events[2]!], sha256)).toEqual({ seq: 3, why: 'sequence 2 expected, found 3' });
  });

  it('when an event is rewritten with a fresh hash, then the next event’s link breaks', () => {
    const events = chain(['received', 'accepted', 'issued']);
    events[1]!.content.reason = 'rewritten';
    events[1]!.hash = sha256(ledgerHashInput(events[1]!.previousHash, events[1]!.content));
    expect(firstBrokenEvent(events, sha256)).toEqual({
      seq: 3,
      why: 'its previous-hash does not match the hash of the event before it',
    });
  });
});
