import { flushPromises } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import SigningDialog from '../../../src/components/SigningDialog.vue';
import { mountInApp, stubFetch } from './support/mount-in-app';

// 21 CFR 11.50 (signature manifestation: printed name, date and time, meaning) and the product's
// own signing sequence; the server's side is tested in tests/api/electronic-signatures.test.ts.
const preparation = {
  recordType: 'lot-release',
  recordId: '42',
  title: 'Release of lot L-42',
  meaning: 'returned-to-engineering',
  content: { lot: 'L-42', status: 'submitted', submittedAt: '2026-07-01T12:00:00.000Z' },
  contentHash: 'a'.repeat(64),
  bindingHash: 'b'.repeat(64),
  statement:
    'By signing, I confirm that this electronic signature is the legally binding equivalent of my handwritten ' +
    'signature.',
  reasonRequired: true,
  trailThroughSeq: null,
  trailEvents: null,
};

describe('the signing dialog', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    document.body.innerHTML = '';
  });

  it(
    'shows exactly what will be signed, in words, and the signature as it will read, before any password is ' + 'asked',
    async () => {
      const asked = stubFetch([{ method: 'POST', path: '/signatures/preparations', body: preparation }]);
      await mountInApp(SigningDialog, {
        props: { recordType: 'lot-release', recordId: '42', meaning: 'returned-to-engineering' },
      });
      const text = document.body.textContent ?? '';
      expect(asked).toEqual([
        {
          method: 'POST',
          path: '/signatures/preparations',
          body: { recordType: 'lot-release', recordId: '42', meaning: 'returned-to-engineering' },
        },
      ]);
      expect(text).toContain('Release of lot L-42');
      expect(text).toContain('Submitted for release');
      // On the plant's clock: 12:00 UTC on 1 July is 13:00 British Summer Time (IANA tz database, Europe/London).
      expect(text).toContain('2026-07-01 13:00');
      expect(text).not.toMatch(/\bsubmitted\b(?! for)/);
      expect(text).toContain(`Content hash (SHA-256): ${'a'.repeat(64)}`);
      expect(text).toMatch(
        /Your signature will read: Test Approver — Returned to engineering — \d{4}-\d{2}-\d{2} \d{2}:\d{2}/,
      );
      expect(text).toContain(preparation.statement);
    },
  );

  it('refuses to go on without the reason the meaning needs, and opens no password window', async () => {
    const asked = stubFetch([{ method: 'POST', path: '/signatures/preparations', body: preparation }]);
    const open = vi.fn();
    vi.stubGlobal('open', open);
    await mountInApp(SigningDialog, {
      props: { recordType: 'lot-release', recordId: '42', meaning: 'returned-to-engineering' },
    });
    const sign = [...document.querySelectorAll('button')].find((button) =>
      button.textContent?.includes('Confirm with password and sign'),
    )!;
    sign.click();
    await flushPromises();
    expect(document.body.textContent).toContain('A reason of at least 3 characters is required');
    expect(open).not.toHaveBeenCalled();
    expect(asked.map((request) => request.path)).toEqual(['/signatures/preparations']);
  });

  it('says why when the record cannot be signed by this person, and offers nothing to sign', async () => {
    stubFetch([
      {
        method: 'POST',
        path: '/signatures/preparations',
        status: 422,
        body: {
          error: {
            code: 'RULE_VIOLATION',
            message: 'You recorded part of this lot; another approver must sign',
            fields: { meaning: 'Separation of duties' },
            requestId: 'r-1',
          },
        },
      },
    ]);
    await mountInApp(SigningDialog, {
      props: { recordType: 'lot-release', recordId: '42', meaning: 'approved-for-release' },
    });
    expect(document.body.textContent).toContain('You recorded part of this lot; another approver must sign');
    expect([...document.querySelectorAll('button')].some((b) => b.textContent?.includes('Confirm with password'))).toBe(
      false,
    );
  });
});
