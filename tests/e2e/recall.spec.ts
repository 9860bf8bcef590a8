import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { parse } from 'csv-parse/sync';
import { loadConfig } from '../../server/src/config/env';
import { signInAs } from './support/sign-in';
import { openedDialog } from './support/dialogs';

const mailCatcher = `http://127.0.0.1:${loadConfig().MAIL_WEB_PORT}`;

test(
  '[E2E-RECALL] a recall coordinator opens a recall from a heat, sees the lots and consignees it reaches, ' +
    'exports them, and the recall team is mailed',
  async ({ page }) => {
    test.setTimeout(60_000);
    await signInAs(page, 'kiw-0501', '/trace');
    await expect(page.getByRole('heading', { level: 1, name: 'Trace and recall' })).toBeVisible();
    // The investigations are reachable without running a trace first.
    await expect(page.locator('.page-lead').getByRole('link', { name: 'recall investigations' })).toHaveAttribute(
      'href',
      '/recalls',
    );
    // A heat that reaches both shipped lots and lots still in the plant.
    const open = await (await page.request.get('/api/lots?status=open&pageSize=1&sort=lotNumber&order=desc')).json();
    const back = await (await page.request.get(`/api/trace/backward?lot=${open.items[0].lotNumber}`)).json();
    const heat = back.heats[0];
    const expected = await (await page.request.get(`/api/trace/forward?heatId=${heat.id}`)).json();

    await page.getByRole('tab', { name: 'What does this touch?' }).click();
    // Typed as a person holds it: the heat number, key by key; the match names its supplier.
    const start = page.getByRole('combobox', { name: 'Start from a heat, bar, run, supplier or part' });
    await start.pressSequentially(heat.heatNumber, { delay: 80 });
    const match = page.getByRole('option', {
      name: new RegExp(`^Heat ${heat.heatNumber.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`),
    });
    await expect(match).toContainText('Heat from');
    await page.screenshot({ path: 'test-results/trace-forward-search.png' });
    await match.click();
    await page.getByRole('button', { name: 'Trace forward' }).click();
    await expect(page.getByRole('heading', { name: `From heat ${heat.heatNumber}` })).toBeVisible();
    await page.getByRole('button', { name: 'Open a recall investigation' }).click();
    const dialog = await openedDialog(page, 'Open a recall investigation');
    await dialog.getByRole('button', { name: 'Open investigation and hold lots' }).click();
    await expect(dialog.getByText('Say in a sentence why the investigation is opened')).toBeVisible();
    await dialog
      .getByLabel('Why is it opened?')
      .fill('The mill reports that bars of this heat may have been mixed up at straightening');
    await dialog.getByRole('button', { name: 'Open investigation and hold lots' }).click();

    const title = page.getByRole('heading', { level: 1, name: /^Recall investigation RC-\d{4}-\d{4}$/ });
    await expect(title).toBeVisible();
    const recallNumber = ((await title.textContent()) ?? '').replace('Recall investigation ', '');
    const lots = page.getByRole('region', { name: 'Affected lots' });
    await expect(lots.getByRole('row')).toHaveCount(expected.lots.length + 1);
    for (const lot of expected.lots) await expect(lots).toContainText(lot.lotNumber);
    await expect(page.getByRole('region', { name: 'Consignees' }).getByRole('row')).toHaveCount(
      expected.consignees.length ? expected.consignees.length + 1 : 0,
    );
    const held = expected.lots.filter(
      (lot: { status: string; onHand: number }) =>
        lot.status !== 'consumed' && (lot.status !== 'released' || lot.onHand > 0),
    );
    await expect(page.getByRole('region', { name: 'Holds' }).getByRole('row')).toHaveCount(held.length + 1);
    await page.screenshot({ path: 'test-results/recall-opened.png', fullPage: true });

    // Exports: the CSV lists every affected lot and consignee; the PDF downloads as a PDF.
    const [csvDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Export CSV' }).click(),
    ]);
    const rows = parse(readFileSync((await csvDownload.path())!, 'utf8'), { columns: true }) as Array<
      Record<string, string>
    >;
    expect(
      rows
        .filter((row) => row.row === 'lot')
        .map((row) => row.lot)
        .sort(),
    ).toEqual(expected.lots.map((lot: { lotNumber: string }) => lot.lotNumber).sort());
    expect(rows.filter((row) => row.row === 'consignee')).toHaveLength(expected.consignees.length);
    const [pdfDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Export PDF' }).click(),
    ]);
    expect(pdfDownload.suggestedFilename()).toBe(`${recallNumber}-opening.pdf`);
    expect(
      readFileSync((await pdfDownload.path())!)
        .subarray(0, 5)
        .toString(),
    ).toBe('%PDF-');

    // The held lot says so on its own page.
    await page.getByRole('region', { name: 'Holds' }).getByRole('link').first().click();
    await expect(
      page.getByText(
        `On hold by recall investigation ${recallNumber}: this lot cannot be released, shipped, split or merged`,
      ),
    ).toBeVisible();

    // The recall team's mail reached the SMTP catcher.
    await expect
      .poll(
        async () => {
          const mails = (await (await page.request.get(`${mailCatcher}/api/email`)).json()) as Array<{
            subject: string;
          }>;
          return mails.some(
            (mail) => mail.subject === `Recall investigation ${recallNumber} opened: heat ${heat.heatNumber}`,
          );
        },
        { timeout: 20_000 },
      )
      .toBe(true);
  },
);
