import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';
import { signWithPassword } from './support/signing';

const typing = { delay: 60 };

test(
  '[E2E-CANNOT-EVALUATE] a heat the library cannot fully judge is shown as such, and is accepted only after a ' +
    'QA approver signs a justification',
  async ({ page }) => {
    const heatNumber = `CE-${Date.now().toString().slice(-6)}`;
    const certificate = Buffer.from(
      `%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n% heat ${heatNumber} certificate\ntrailer << /Root 1 0 R ` +
        `>>\n%%EOF\n`,
    );

    // An engineer receives a stainless heat bought to ISO 5832-1, whose mechanical minima the library does not hold.
    await signInAs(page, 'kiw-0101', '/heats');
    await page.getByRole('button', { name: 'Receive a heat' }).click();
    const dialog = await openedDialog(page, 'Receive a heat');
    await dialog.getByLabel('Heat number').pressSequentially(heatNumber, typing);
    await dialog.getByLabel('Supplier').click();
    await page.getByRole('option', { name: /Nordvik Titanium Mill/ }).click();
    await dialog.getByLabel('Specification').click();
    await page.getByRole('option', { name: 'ISO 5832-1' }).click();
    await dialog.getByLabel('Product form').click();
    // Only the forms the revision covers are offered.
    await expect(page.getByRole('option', { name: 'Tube' })).toHaveCount(0);
    await page.getByRole('option', { name: 'Bar', exact: true }).click();
    await dialog.getByLabel('Condition').click();
    await page.getByRole('option', { name: 'Annealed' }).click();
    await dialog.getByLabel('Melt route').pressSequentially('VIM + ESR', typing);
    await dialog.getByLabel('Diameter or thickness (mm)').pressSequentially('12.7', typing);
    await page.waitForTimeout(800);
    await dialog.getByRole('button', { name: 'Receive heat' }).click();
    await expect(page.getByRole('heading', { level: 1, name: `Heat ${heatNumber}` })).toBeVisible();
    await expect(page.locator('.page-lead')).toContainText('Bar 12.7 mm, annealed');

    await page
      .getByLabel('Certificate file')
      .setInputFiles({ name: `certificate ${heatNumber}.pdf`, mimeType: 'application/pdf', buffer: certificate });
    const results = page.getByRole('form', { name: 'Certificate results' });
    for (const [element, value] of Object.entries({
      C: '0.021',
      Si: '0.45',
      Mn: '1.62',
      P: '0.018',
      S: '0.003',
      Cr: '17.9',
      Mo: '2.71',
      Ni: '14.2',
      N: '0.06',
      Cu: '0.12',
    })) {
      await results.getByLabel(element, { exact: true }).pressSequentially(value, typing);
    }
    await results.getByLabel('Tensile strength (MPa)').pressSequentially('610', typing);
    await results.getByLabel('0.2 % yield strength (MPa)').pressSequentially('295', typing);
    await results.getByLabel('Elongation (%)').pressSequentially('48', typing);
    await results.getByRole('button', { name: 'Save and evaluate' }).click();
    const evaluation = page.getByRole('region', { name: 'Evaluation', exact: true });
    await expect(evaluation).toContainText('Mechanical requirements');
    await expect(evaluation).toContainText('No requirement for this form, condition or size');
    await expect(page.locator('.status')).toContainText('Cannot be evaluated');
    await expect(page.getByText('1 item cannot be evaluated.')).toBeVisible();
    await page.screenshot({ path: 'test-results/heat-cannot-be-evaluated.png', fullPage: true });
    const heatPath = new URL(page.url()).pathname;

    // A QA approver reads why and signs a justification with a reason typed at a person's pace.
    await signInAs(page, 'kiw-0301', heatPath);
    await expect(page.getByText('Some items cannot be evaluated.')).toBeVisible();
    await page.getByRole('button', { name: 'Sign a justification' }).click();
    const signing = await openedDialog(page, 'Sign: Justified for acceptance');
    await expect(signing).toContainText('Mechanical requirements');
    await signing
      .getByLabel(/^Reason/)
      .pressSequentially('Minima checked against our licensed ISO 5832-1:2024, table 3', { delay: 30 });
    await page.screenshot({ path: 'test-results/heat-justification-dialog.png', fullPage: true });
    await signWithPassword(
      page,
      'Justified for acceptance',
      'Joaquín Ferreira — Justified for acceptance',
      'joaquin-demo',
      undefined,
      20,
    );
    await expect(page.getByText('covered by a QA approver’s signed justification')).toBeVisible();

    // The QA reviewer can now accept it.
    await signInAs(page, 'kiw-0201', heatPath);
    await page.getByRole('button', { name: 'Accept' }).click();
    const accepting = await openedDialog(page, 'Sign: Accepted');
    await expect(accepting).toContainText('Minima checked against our licensed ISO 5832-1:2024');
    await signWithPassword(page, 'Accepted', 'Aisling Ní Bhriain — Accepted', 'aisling-demo', undefined, 20);
    await expect(page.locator('.status')).toContainText('Accepted');
    await page.screenshot({ path: 'test-results/heat-accepted-on-justification.png', fullPage: true });
  },
);
