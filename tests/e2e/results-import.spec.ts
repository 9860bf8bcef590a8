import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

test(
  'an engineer imports certificate results from CSV: the check lists bad rows, and only the valid ones are ' +
    'imported on request',
  async ({ page }) => {
    await signInAs(page, 'kiw-0101', '/heats');
    await page.getByRole('button', { name: 'Import results (CSV)' }).click();
    const dialog = await openedDialog(page, 'Import certificate results from CSV');
    const csv = [
      'supplier,heat_number,Al,V,Fe,O,C,N,H,uts_mpa,ys_mpa,elongation_pct,reduction_of_area_pct',
      'Oriel Bar & Wire,OB-55120,6.02,4.03,0.15,0.11,0.02,0.01,0.004,928,858,15,40',
      'Oriel Bar & Wire,OB-00000,6.02,4.03,0.15,0.11,0.02,0.01,0.004,928,858,15,40',
    ].join('\n');
    await dialog
      .getByLabel('CSV file')
      .setInputFiles({ name: 'results.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await expect(dialog.getByTestId('import-check')).toHaveText('2 rows: 1 valid, 1 with problems.');
    await expect(dialog.getByRole('table')).toContainText('No heat OB-00000 from Oriel Bar & Wire');
    await page.screenshot({ path: 'test-results/results-import.png' });
    await dialog.getByRole('button', { name: 'Import only the 1 valid rows' }).click();
    await expect(dialog.getByTestId('import-result')).toContainText('Imported 1 heat(s): OB-55120 conforms');
  },
);
