import { flushPromises } from '@vue/test-utils';
import InputNumber from 'primevue/inputnumber';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { EffectivenessView, ReplyPage } from '@shared/schemas/field-action';
import ReplyView from '../../../src/views/ReplyView.vue';
import EffectivenessPanel from '../../../src/components/EffectivenessPanel.vue';
import { mountInApp, stubFetch } from './support/mount-in-app';

// The reply page and the effectiveness figures as people read them (the product's own screens, no
// published source; the figures themselves are tested in tests/unit/shared/recall).
const token = 'T'.repeat(43);
const page: ReplyPage = {
  recallNumber: 'RC-2026-0009',
  firm: 'Test Works',
  timeZone: 'Europe/London',
  consignee: 'Clinic A',
  drill: false,
  actionAsked: 'Quarantine and return the units.',
  lots: [
    {
      lotId: 4,
      lotNumber: 'L0004',
      part: 'P-1 Screw',
      gtin: '09521230000154',
      shipped: 6,
      udi: '(01)09521230000154(10)L0004',
    },
  ],
  lastReply: null,
};

describe('the consignee reply page', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    document.body.innerHTML = '';
  });

  it('flags counts that add up to more than was shipped while they are typed, before anything is sent', async () => {
    const asked = stubFetch([{ path: `/replies/${token}`, body: page }]);
    const wrapper = await mountInApp(ReplyView, { path: `/reply/${token}` });
    expect(document.body.textContent).toContain('Recall RC-2026-0009: your answer');
    expect(document.body.textContent).toContain('6 units shipped to you');
    const inputs = wrapper.findAllComponents(InputNumber);
    expect(inputs).toHaveLength(4);
    inputs[0]!.vm.$emit('input', { value: 4 });
    inputs[1]!.vm.$emit('input', { value: 3 });
    await flushPromises();
    expect(document.body.textContent).toContain('These add up to 7; 6 units were shipped to you');
    inputs[1]!.vm.$emit('input', { value: 2 });
    await flushPromises();
    expect(document.body.textContent).not.toContain('These add up to');
    expect(document.body.textContent).toContain('Accounted for: 6 of 6');
    expect(asked.filter((request) => request.method !== 'GET')).toEqual([]);
  });

  it('shows a plain page, naming no record, when the link opens nothing', async () => {
    stubFetch([]);
    await mountInApp(ReplyView, { path: `/reply/${token}` });
    expect(document.body.textContent).toContain('This link does not open a notice');
    expect(document.querySelector('form')).toBeNull();
  });
});

const clinicLine: EffectivenessView['lines'][number] = {
  consigneeId: 1,
  consignee: 'Clinic A',
  lotId: 4,
  lotNumber: 'L0004',
  shipped: 6,
  onHand: 1,
  returned: 2,
  destroyed: 0,
  used: 2,
  accounted: 5,
  unaccounted: 1,
  received: 2,
  answered: true,
};

const figures: EffectivenessView = {
  level: 'B',
  percent: 40,
  consignees: 5,
  notified: 5,
  replied: 1,
  needed: 2,
  met: false,
  shortfalls: ['1 of the 2 consignee replies the level needs'],
  unitsShipped: 20,
  unitsAccounted: 5,
  lines: [
    clinicLine,
    {
      consigneeId: 2,
      consignee: 'Depot B',
      lotId: 4,
      lotNumber: 'L0004',
      shipped: 14,
      onHand: 0,
      returned: 0,
      destroyed: 0,
      used: 0,
      accounted: 0,
      unaccounted: 14,
      received: 0,
      answered: false,
    },
  ],
  differences: [{ ...clinicLine, problem: '1 of 6 units shipped are not accounted for' }],
  series: [{ at: '2026-12-05T10:00:00.000Z', accounted: 5 }],
};

describe('the effectiveness figures', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('names the level with its share and source, says it is not met and why, and lists the differences', async () => {
    const wrapper = await mountInApp(EffectivenessPanel, { props: { effectiveness: figures, levelBPercent: 40 } });
    const text = wrapper.text();
    expect(text).toContain('Level B: a share above 10 % and below 100 %, set for this recall (40 %)');
    expect(text).toContain('21 CFR 7.42(b)(3)');
    expect(wrapper.get('[data-testid="effectiveness-met"]').text()).toBe('Level not met');
    expect(text).toContain('1 of the 2 consignee replies the level needs');
    expect(wrapper.get('[data-testid="effectiveness-units"]').text()).toMatch(/^5 of 20 shipped \(25 %\)$/);
    expect(wrapper.get('[data-testid="balance-differences"]').text()).toBe(
      'Clinic A, lot L0004: 1 of 6 units shipped are not accounted for',
    );
    // A consignee that has not answered shows no counts of its own, rather than zeros.
    const depot = wrapper.findAll('tbody tr').find((row) => row.text().startsWith('Depot B'))!;
    expect(depot.text()).toContain('no answer yet');
  });
});
