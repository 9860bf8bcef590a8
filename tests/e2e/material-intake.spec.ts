import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

const certificatePdf = Buffer.from(
  '%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n% heat E2E-4711 certificate\ntrailer << /Root 1 0 R >>\n%%EOF\n',
);

test(
  '[E2E-INTAKE] an engineer receives a heat, attaches its certificate and enters results; a QA reviewer accepts ' +
    'it with a signature',
  async ({ page }) => {
    await signInAs(page, 'kiw-0101', '/heats');
    await expect(page.getByRole('heading', { level: 1, name: 'Heats and certificates' })).toBeVisible();
    await expect(page.getByRole('note', { name: 'Specification limits caution' })).toContainText(
      'verify them against your licensed copy',
    );
    await expect(page.getByRole('table')).toContainText('BAW-7905');

    await page.getByRole('button', { name: 'Receive a heat' }).click();
    const dialog = await openedDialog(page, 'Receive a heat');
    await dialog.getByLabel('Heat number').fill('E2E-4711');
    await dialog.getByLabel('Supplier').click();
    await page.getByRole('option', { name: /Nordvik Titanium Mill/ }).click();
    await dialog.getByLabel('Specification').click();
    await page.getByRole('option', { name: 'ASTM F136' }).click();
    await dialog.getByLabel('Product form').click();
    await page.getByRole('option', { name: 'Bar', exact: true }).click();
    // F136 in the library covers the annealed condition only, so it is chosen already.
    await expect(dialog.getByLabel('Condition')).toContainText('Annealed');
    await dialog.getByLabel('Melt route').fill('VAR ×3');
    await dialog.getByLabel('Diameter or thickness (mm)').fill('25.4');
    await dialog.getByRole('button', { name: 'Receive heat' }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'Heat E2E-4711' })).toBeVisible();

    await page
      .getByLabel('Certificate file')
      .setInputFiles({ name: 'certificate E2E-4711.pdf', mimeType: 'application/pdf', buffer: certificatePdf });
    await expect(page.getByRole('list', { name: 'Certificate documents' })).toContainText('certificate E2E-4711.pdf');

    const results = page.getByRole('form', { name: 'Certificate results' });
    for (const [element, value] of Object.entries({
      Al: '6.08',
      V: '4.01',
      Fe: '0.17',
      O: '0.115',
      C: '0.02',
      N: '0.01',
      H: '40 ppm',
    })) {
      await results.getByLabel(element, { exact: true }).fill(value);
    }
    await results.getByLabel('Tensile strength (MPa)').fill('951');
    await results.getByLabel('0.2 % yield strength (MPa)').fill('879');
    await results.getByLabel('Elongation (%)').fill('14');
    await results.getByLabel('Reduction of area (%)').fill('40');
    await results.getByRole('button', { name: 'Save and evaluate' }).click();
    const evaluation = page.getByRole('table', { name: 'Evaluation items' }).or(page.locator('table').last());
    await expect(page.getByRole('heading', { name: 'Evaluation' })).toBeVisible();
    await expect(evaluation).toContainText('40 ppm = 0.0040 %');
    await expect(page.getByText('Alloy class')).toBeVisible();
    await page.screenshot({ path: 'test-results/heat-evaluated.png', fullPage: true });

    // The QA reviewer accepts it with an electronic signature.
    const url = page.url();
    await signInAs(page, 'kiw-0201', new URL(url).pathname);
    await page.getByRole('button', { name: 'Accept' }).click();
    const signing = await openedDialog(page, 'Sign: Accepted');
    await expect(signing).toContainText('Heat E2E-4711 from Nordvik Titanium Mill');
    const popupOpened = page.waitForEvent('popup');
    await signing.getByRole('button', { name: 'Confirm with password and sign' }).click();
    const popup = await popupOpened;
    await popup.getByLabel('Password').fill('aisling-demo');
    await popup.getByRole('button', { name: 'Sign in' }).click();
    await expect(signing.getByTestId('signature-manifestation')).toContainText('Aisling Ní Bhriain — Accepted', {
      timeout: 15_000,
    });
    await signing.getByRole('button', { name: 'Done' }).click();
    await expect(page.locator('.status')).toContainText('Accepted');
    await page.screenshot({ path: 'test-results/heat-accepted.png', fullPage: true });
  },
);
