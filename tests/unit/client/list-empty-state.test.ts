import { mount } from '@vue/test-utils';
import { describe, expect, it } from 'vitest';
import ListEmptyState from '../../../src/components/ListEmptyState.vue';

// The product's own rule for empty lists (issue: "No lots match" behind a spinner and beside an error); no published
// source.
describe('an empty list says why it is empty', () => {
  const render = (props: { loading: boolean; failed: boolean; empty: string; hint?: string | null }) =>
    mount(ListEmptyState, { props }).text();

  it('when the list is loading, then it says so and not that nothing matches', () => {
    expect(render({ loading: true, failed: false, empty: 'No lots match.', hint: 'Open a lot.' })).toBe('Loading…');
  });
  it('when the list could not be loaded, then it says so even while a retry is pending', () => {
    expect(render({ loading: true, failed: true, empty: 'No lots match.' })).toBe(
      'This list could not be loaded; the reason is shown above.',
    );
  });
  it('when nothing matches, then the hint to act shows only if one is given (a person allowed to act)', () => {
    expect(
      render({
        loading: false,
        failed: false,
        empty: 'No lots match.',
        hint: 'Open a lot for a part to start its record.',
      }),
    ).toBe('No lots match. Open a lot for a part to start its record.');
    expect(render({ loading: false, failed: false, empty: 'No lots match.', hint: null })).toBe('No lots match.');
  });
});
