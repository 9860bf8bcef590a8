import { flushPromises } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import RaiseNonconformanceDialog from '../../../src/components/RaiseNonconformanceDialog.vue';
import SupplierDialog from '../../../src/components/SupplierDialog.vue';
import { mountInApp, stubFetch } from './support/mount-in-app';

// The API's one error shape reaching the field it names (the product's own contract, no published source).
const byText = (text: string) =>
  [...document.querySelectorAll('button')].find((button) => button.textContent?.trim() === text)!;

async function type(selector: string, value: string) {
  const field = document.querySelector<HTMLInputElement | HTMLTextAreaElement>(selector)!;
  field.value = value;
  field.dispatchEvent(new Event('input'));
  await flushPromises();
}

describe('dialogs that record', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    document.body.innerHTML = '';
  });

  it(
    'raising a nonconformance sends what was typed for its subject and shows the server’s message under its ' + 'field',
    async () => {
      const asked = stubFetch([
        {
          method: 'POST',
          path: '/nonconformances',
          status: 400,
          body: {
            error: {
              code: 'VALIDATION_FAILED',
              message: 'Some fields are not valid',
              fields: { containment: 'Say what was done to contain it' },
              requestId: 'r-2',
            },
          },
        },
      ]);
      await mountInApp(RaiseNonconformanceDialog, {
        props: { subjectType: 'lot', subjectId: 12, subjectLabel: 'lot L-12' },
        roles: ['manufacturing-engineer'],
      });
      await type('#nc-description', 'Burr on the thread');
      document.querySelector('form')!.dispatchEvent(new Event('submit'));
      await flushPromises();
      expect(asked).toEqual([
        {
          method: 'POST',
          path: '/nonconformances',
          body: { subjectType: 'lot', subjectId: 12, description: 'Burr on the thread', containment: '' },
        },
      ]);
      expect(document.querySelector('#nc-containment + .field-error, .field-error')?.textContent).toBe(
        'Say what was done to contain it',
      );
    },
  );

  it('adding a supplier refuses locally what is missing (its approval) and sends nothing to the server', async () => {
    const asked = stubFetch([
      {
        method: 'POST',
        path: '/suppliers',
        status: 409,
        body: {
          error: {
            code: 'CONFLICT',
            message: 'A supplier named Norrvik exists already',
            fields: { name: 'Already registered' },
            requestId: 'r-3',
          },
        },
      },
    ]);
    await mountInApp(SupplierDialog, { roles: ['qa-approver'] });
    byText('Add supplier').click();
    await flushPromises();
    expect(asked).toEqual([]);
    expect(document.body.textContent).toContain('Choose the supplier’s approval');
    await type('#supplier-name', 'Norrvik');
    byText('Add supplier').click();
    await flushPromises();
    expect(asked).toEqual([]);
  });
});
