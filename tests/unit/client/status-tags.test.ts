import { mount } from '@vue/test-utils';
import PrimeVue from 'primevue/config';
import { describe, expect, it } from 'vitest';
import { lotStatuses } from '@shared/schemas/manufacturing';
import HeatStatusTag from '../../../src/components/HeatStatusTag.vue';
import LotStatusTag from '../../../src/components/LotStatusTag.vue';
import LimitCaution from '../../../src/components/LimitCaution.vue';
import { limitCaution } from '@shared/domain/materials/specification';

// WORDS.md: labels never show raw codes; the product's own rule, no published source.
const render = (component: object, props: Record<string, unknown>) =>
  mount(component, { props, global: { plugins: [PrimeVue] } });

describe('status tags', () => {
  it('name every lot status in words, never as its stored code', () => {
    const words = lotStatuses.map((status) => render(LotStatusTag, { value: status }).text());
    expect(words).toEqual(['Open', 'Consumed', 'Submitted for release', 'Reviewed', 'Released', 'Rejected']);
  });

  it(
    'colour a lot by what it asks of people: released is ' + 'good, rejected is a danger, an unknown code is neutral',
    () => {
      expect(render(LotStatusTag, { value: 'released' }).classes()).toContain('p-tag-success');
      expect(render(LotStatusTag, { value: 'rejected' }).classes()).toContain('p-tag-danger');
      const unknown = render(LotStatusTag, { value: 'on-the-moon' });
      expect(unknown.classes()).toContain('p-tag-secondary');
      expect(unknown.text()).not.toBe('on-the-moon');
    },
  );

  it('name a heat’s status and verdict in words, and say so when there are no results yet', () => {
    expect(render(HeatStatusTag, { value: 'quarantined', kind: 'status' }).text()).toBe('Quarantined');
    expect(render(HeatStatusTag, { value: 'does-not-conform', kind: 'verdict' }).text()).toMatch(/^Does not conform/);
    expect(render(HeatStatusTag, { value: null, kind: 'verdict' }).text()).toBe('No results yet');
    expect(render(HeatStatusTag, { value: 'accepted', kind: 'status' }).classes()).toContain('p-tag-success');
  });
});

describe('the limit caution', () => {
  it('is a note that asks the firm to verify the shipped limits against its licensed standard', () => {
    const note = render(LimitCaution, {});
    expect(note.attributes('role')).toBe('note');
    expect(note.text()).toBe(limitCaution);
    expect(limitCaution).toMatch(/verif/i);
  });
});
