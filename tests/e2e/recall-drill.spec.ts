import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { parse } from 'csv-parse/sync';
import { signInAs } from './support/sign-in';

test(
  '[E2E-DRILL] an auditor lists the plant’s recall drills with their durations and reads one drill’s report, on ' +
    'screen, as CSV and as PDF',
  async ({ page }) => {
    await signInAs(page, 'kiw-0401', '/recalls');
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    await page.getByLabel('Filter by kind').click();
    await page.getByRole('option', { name: 'Drills' }).click();
    const table = page.getByRole('table');
    await expect(table).toContainText('Half-yearly recall rehearsal');
    await expect(table.getByRole('columnheader', { name: 'Opened to closed' })).toBeVisible();
    await expect(table).toContainText(/\d+ (ms|s|min)/);
    await table
      .getByRole('link', { name: /^DR-\d{4}-\d{4}$/ })
      .first()
      .click();

    const report = page.getByRole('region', { name: 'Drill report' });
    await expect(report).toContainText('scope complete');
    await expect(report).toContainText('Scope confirmed complete after');
    await expect(report.getByRole('list', { name: 'Completeness checks' }).getByRole('listitem')).toHaveCount(5);
    await expect(report).toContainText('Every shipped unit is accounted for');
    await page.screenshot({ path: 'test-results/recall-drill-report.png', fullPage: true });

    const [csvDownload] = await Promise.all([
      page.waitForEvent('download'),
      report.getByRole('link', { name: 'Drill report CSV' }).click(),
    ]);
    const rows = parse(readFileSync((await csvDownload.path())!, 'utf8'), { columns: true }) as Array<{
      section: string;
      value: string;
    }>;
    expect(rows.filter((row) => row.section === 'check').map((row) => row.value)).toEqual([
      'passed',
      'passed',
      'passed',
      'passed',
      'passed',
    ]);
    const [pdfDownload] = await Promise.all([
      page.waitForEvent('download'),
      report.getByRole('link', { name: 'Drill report PDF' }).click(),
    ]);
    expect(pdfDownload.suggestedFilename()).toMatch(/^DR-\d{4}-\d{4}-drill-report\.pdf$/);
    expect(
      readFileSync((await pdfDownload.path())!)
        .subarray(0, 5)
        .toString(),
    ).toBe('%PDF-');
  },
);
