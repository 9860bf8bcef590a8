import { flushPromises } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { defineComponent, h, ref } from 'vue';
import SignatureList from '../../../src/components/SignatureList.vue';
import SignedContentView from '../../../src/components/SignedContentView.vue';
import { useFocusReturn } from '../../../src/composables/useFocusReturn';
import { usePlantTime } from '../../../src/composables/usePlantTime';
import { mountInApp, stubFetch } from './support/mount-in-app';

// Clock changes from the IANA tz database (Europe/London: BST from 2026-03-29 01:00 UTC to
// 2026-10-25 01:00 UTC); WCAG 2.1 SC 2.4.3 (focus order) for the focus return.
const Clock = defineComponent({
  setup() {
    const { dateTime, date, note } = usePlantTime();
    return () =>
      h('p', [
        dateTime('2026-03-29T00:59:00Z'),
        ' | ',
        dateTime('2026-03-29T01:00:00Z'),
        ' | ',
        date('2026-10-24T23:30:00Z'),
        ' | ',
        dateTime(null),
        ' | ',
        note.value,
      ]);
  },
});

describe('the plant’s clock on screens', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    document.body.innerHTML = '';
  });

  it('reads every instant on the plant’s zone across the spring clock change, and says which zone', async () => {
    const wrapper = await mountInApp(Clock, { timeZone: 'Europe/London' });
    expect(wrapper.text()).toBe('2026-03-29 00:59 | 2026-03-29 02:00 | 2026-10-25 | — | times in Europe/London');
  });

  it('reads the same instants on another plant’s clock (UTC+9, no clock change)', async () => {
    const wrapper = await mountInApp(Clock, { timeZone: 'Asia/Tokyo' });
    expect(wrapper.text()).toBe('2026-03-29 09:59 | 2026-03-29 10:00 | 2026-10-25 | — | times in Asia/Tokyo');
  });

  it('shows signed content with its times on the plant’s clock and its states in words', async () => {
    const wrapper = await mountInApp(SignedContentView, {
      props: { content: { lot: 'L-7', status: 'released', releasedAt: '2026-07-01T12:00:00.000Z' } },
    });
    expect(wrapper.text()).toContain('Dates and times: times in Europe/London');
    expect(wrapper.text()).toContain('2026-07-01 13:00');
    expect(wrapper.text()).toContain('Released');
    expect(wrapper.text()).not.toContain('2026-07-01T12:00');
  });
});

describe('signatures of a record', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    document.body.innerHTML = '';
  });

  const signature = (id: number, changedAfterSigning: boolean) => ({
    id,
    recordType: 'heat',
    recordId: '5',
    meaning: 'accepted',
    reason: id === 2 ? 'Certificate re-issued' : null,
    signerId: 3,
    signerName: 'Test Reviewer',
    signerRole: 'qa-reviewer',
    signedAt: '2026-07-01T12:00:00.000Z',
    manifestation: `Test Reviewer — Accepted — 2026-07-01 13:00:0${id} BST`,
    contentHash: 'c'.repeat(64),
    withdrawsSignatureId: null,
    changedAfterSigning,
  });

  it(
    'lists each manifestation with its reason, and marks ' + 'only the one whose record changed after signing',
    async () => {
      stubFetch([{ path: '/signatures?recordType=heat&recordId=5', body: [signature(1, false), signature(2, true)] }]);
      const wrapper = await mountInApp(SignatureList, { props: { recordType: 'heat', recordId: '5' } });
      await flushPromises();
      const items = wrapper.findAll('li').map((item) => item.text());
      expect(items).toEqual([
        'Test Reviewer — Accepted — 2026-07-01 13:00:01 BST',
        'Test Reviewer — Accepted — 2026-07-01 13:00:02 BST· Certificate re-issuedChanged after signing',
      ]);
    },
  );

  it('says the record is not signed yet when it has no signature', async () => {
    stubFetch([{ path: '/signatures?recordType=heat&recordId=6', body: [] }]);
    const wrapper = await mountInApp(SignatureList, { props: { recordType: 'heat', recordId: '6' } });
    await flushPromises();
    expect(wrapper.text()).toBe('Not signed yet.');
  });
});

describe('focus after a dialog', () => {
  it('goes back to the button that opened it when the dialog goes away', async () => {
    const Dialogish = defineComponent({
      setup() {
        useFocusReturn();
        return () => h('div', { role: 'dialog' }, [h('input', { id: 'inside' })]);
      },
    });
    const Host = defineComponent({
      setup() {
        const open = ref(false);
        return () =>
          h('div', [
            h('button', { id: 'opener', onClick: () => (open.value = true) }, 'Open'),
            h('button', { id: 'closer', onClick: () => (open.value = false) }, 'Close'),
            open.value ? h(Dialogish) : null,
          ]);
      },
    });
    const wrapper = await mountInApp(Host);
    const opener = wrapper.find('#opener').element as HTMLButtonElement;
    opener.focus();
    await wrapper.find('#opener').trigger('click');
    (wrapper.find('#inside').element as HTMLInputElement).focus();
    expect(document.activeElement?.id).toBe('inside');
    await wrapper.find('#closer').trigger('click');
    await flushPromises();
    expect(document.activeElement?.id).toBe('opener');
    wrapper.unmount();
  });
});
