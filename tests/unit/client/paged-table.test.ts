import { mount } from '@vue/test-utils';
import PrimeVue from 'primevue/config';
import Column from 'primevue/column';
import { describe, expect, it } from 'vitest';
import { h } from 'vue';
import PagedTable from '../../../src/components/PagedTable.vue';

// The product's one paged list (its paging contract with the API's page envelope); no published source.
const rows = (count: number, from = 1) =>
  Array.from({ length: count }, (_, index) => ({ id: from + index, lotNumber: `L-${from + index}` }));

function render(props: Record<string, unknown>) {
  return mount(PagedTable, {
    props: { label: 'Production lots', loading: false, paging: { page: 1, pageSize: 20 }, result: undefined, ...props },
    slots: {
      default: () => h(Column, { field: 'lotNumber', header: 'Lot' }),
      empty: () => 'No lots match.',
    },
    global: { plugins: [PrimeVue] },
  });
}

describe('the paged table', () => {
  it('shows the page the server sent, named for screen readers, with its columns', () => {
    const table = render({ result: { items: rows(3), total: 3 } });
    expect(table.find('[aria-label="Production lots"]').exists()).toBe(true);
    expect(table.findAll('tbody tr').map((row) => row.text())).toEqual(['L-1', 'L-2', 'L-3']);
  });

  it('shows the empty slot when there are no rows to show (none yet, or none match), and only then', () => {
    expect(render({ result: { items: [], total: 0 } }).text()).toContain('No lots match.');
    expect(render({ result: undefined }).text()).toContain('No lots match.');
    expect(render({ result: { items: rows(1), total: 1 } }).text()).not.toContain('No lots match.');
  });

  it('asks for the next page as page number and size, counting pages from 1 as the API does', async () => {
    const table = render({ result: { items: rows(20), total: 45 } });
    await table.find('button[aria-label="Next Page"]').trigger('click');
    expect(table.emitted('page')).toEqual([[{ page: 2, pageSize: 20 }]]);
  });

  it('starts the paginator at the page it is given (page 3 of 20 shows rows 41 on)', () => {
    const table = render({ result: { items: rows(5, 41), total: 45 }, paging: { page: 3, pageSize: 20 } });
    expect(table.find('[aria-current="page"]').text()).toBe('3');
  });
});
