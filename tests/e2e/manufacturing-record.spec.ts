import { expect, test, type Page } from '@playwright/test';
import { signInAs } from './support/sign-in';
import { signWithPassword } from './support/signing';
import { openedDialog } from './support/dialogs';
import { expectNoOverlappingFields } from './support/layout';

/** Calls the API as the signed-in person (the browser's own session and CSRF token). */
async function api(page: Page, method: 'get' | 'post', path: string, data?: unknown) {
  const me = await (await page.request.get('/api/me')).json();
  const response = await page.request[method](`/api${path}`, { data, headers: { 'X-CSRF-Token': me.csrfToken } });
  expect(response.ok(), `${method} ${path}: ${await response.text()}`).toBe(true);
  return response.json();
}

test(
  '[E2E-MANUFACTURING] an engineer opens a lot from a bar, records its operations, runs it with two other lots ' +
    'through passivation and cleaning, and raises a nonconformance that QA closes',
  async ({ page }) => {
    test.setTimeout(120_000);
    await signInAs(page, 'kiw-0102', '/lots');
    await expect(page.getByRole('heading', { level: 1, name: 'Production lots' })).toBeVisible();

    // A fresh bar from an accepted F136 heat, and two companion lots brought to the same step through the API.
    const heats = await api(page, 'get', '/heats?status=accepted&search=NV-25&pageSize=1');
    const heatId = heats.items[0].id;
    await api(page, 'post', '/bar-pieces', {
      heatId,
      markedHeatNumber: heats.items[0].heatNumber,
      tag: 'E2E-LOT-BAR-1',
      diameterMm: '25.4',
      lengthMm: '3000',
      location: 'E2E rack',
    });
    const parts = await api(page, 'get', '/parts');
    const screw = parts.find((part: { partNumber: string }) => part.partNumber === 'KIW-CS35-40');
    const companions: string[] = [];
    for (const _ of [1, 2]) {
      const lot = await api(page, 'post', '/lots', { partId: screw.id, plannedQty: 10 });
      await api(page, 'post', `/lots/${lot.id}/material-issues`, { tag: 'E2E-LOT-BAR-1', lengthMm: '450' });
      for (const stepNo of [10, 20]) {
        await api(page, 'post', `/lots/${lot.id}/operations`, {
          stepNo,
          operatorName: 'E2E',
          workCentre: 'Cell',
          startedAt: '2026-11-30T08:00:00Z',
          endedAt: '2026-11-30T09:00:00Z',
          qtyIn: 10,
          qtyGood: 10,
          qtyScrap: 0,
        });
      }
      companions.push(lot.lotNumber);
    }

    // The lot under test goes through the screens.
    await page.getByRole('button', { name: 'Open a lot' }).click();
    const open = await openedDialog(page, 'Open a production lot');
    await open.getByLabel('Part').click();
    await page.getByRole('option', { name: /KIW-CS35-40/ }).click();
    await open.getByLabel('Planned quantity (units)').fill('20');
    await open.getByRole('button', { name: 'Open lot' }).click();
    const title = page.getByRole('heading', { level: 1, name: /^Lot CS\d{6}/ });
    await expect(title).toBeVisible();
    const lotNumber = ((await title.textContent()) ?? '').match(/CS\d{6}/)![0];

    // Scan the bar tag (a scanner types and presses Enter), then the length.
    await page.getByLabel('Bar tag (scan or type)').fill('e2e-lot-bar-1');
    await page.getByLabel('Bar tag (scan or type)').press('Enter');
    await expect(page.getByLabel('Length (mm)')).toBeFocused();
    await page.getByLabel('Length (mm)').fill('9999');
    await page.getByRole('button', { name: 'Issue bar' }).click();
    await expect(page.getByText('Piece E2E-LOT-BAR-1 has 2100.00 mm left; 9999 mm cannot be issued')).toBeVisible();
    await page.getByLabel('Bar tag (scan or type)').fill('E2E-LOT-BAR-1');
    await page.getByLabel('Length (mm)').fill('900');
    await page.getByRole('button', { name: 'Issue bar' }).click();
    await expect(page.getByRole('status')).toContainText('Issued 900 mm of E2E-LOT-BAR-1');

    // The release checklist on the same page follows each record without a reload.
    const checklist = page.getByRole('list', { name: 'Release checklist' });
    await expect(checklist).toContainText('step 10 Swiss-turn and thread is not recorded');
    for (const [step, scrap] of [
      [10, 2],
      [20, 0],
    ] as const) {
      await page.getByRole('button', { name: `Record step ${step}` }).click();
      const dialog = await openedDialog(page, new RegExp(`^Record step ${step}`));
      if (step === 10) {
        // No field spills into its neighbour, on a desktop and on a tablet held upright.
        await expectNoOverlappingFields(dialog, 'the record-step dialog at 1280 px');
        await page.setViewportSize({ width: 768, height: 1024 });
        await expectNoOverlappingFields(dialog, 'the record-step dialog at 768 px');
        await dialog.screenshot({ path: 'test-results/record-step-tablet.png' });
        await page.setViewportSize({ width: 1280, height: 720 });
      }
      await dialog
        .getByLabel('Work centre')
        .pressSequentially(step === 10 ? 'Swiss lathe 2' : 'Machining cell 4', { delay: 40 });
      await dialog.getByLabel('Units in').fill(step === 10 ? '20' : '18');
      await dialog.getByLabel('Units in').press('Tab');
      await dialog.getByLabel('Scrapped').fill(String(scrap));
      await dialog.getByLabel('Scrapped').press('Tab');
      if (scrap) await dialog.getByLabel('Scrap reason').fill('Thread damaged');
      await expect(dialog.getByTestId('qty-good')).toHaveText('18');
      await dialog.getByRole('button', { name: 'Record step' }).click();
      await expect(dialog).toBeHidden();
    }
    await expect(page.getByRole('table', { name: 'Routing steps' })).toContainText('20 / 18 / 2');
    await expect(checklist).not.toContainText('step 10 Swiss-turn and thread is not recorded');
    await expect(checklist).not.toContainText('step 20 Hex drive and deburr is not recorded');
    await expect(checklist).toContainText('step 30 Passivate is not recorded');
    await expect(page.getByText('Next: step 30 Passivate')).toBeVisible();

    // Passivation in window, then cleaning out of window, each with the two companion lots.
    for (const run of [
      {
        kind: 'passivation',
        method: /ASTM F86 nitric/,
        values: {
          'Bath identity': 'P1 E2E',
          'Nitric acid concentration': '30',
          'Bath temperature': '25',
          'Immersion time': '35',
          'Final rinse water conductivity': '1.5',
        },
      },
      {
        kind: 'cleaning',
        method: /Final aqueous ultrasonic clean/,
        values: {
          'Detergent and lot': 'D-1 lot 9',
          'Detergent concentration': '2',
          'Wash temperature': '63',
          'Ultrasonic wash time': '15',
          'Rinse temperature': '30',
          'Rinse time': '6',
          'Final rinse water conductivity': '1.1',
          'Residue: total organic carbon per device': '100',
          'Residue: bacterial endotoxin': '2',
        },
      },
    ]) {
      await page.goto(`/process-runs?record=${run.kind}`);
      const dialog = await openedDialog(page, 'Record a process run');
      await dialog.getByLabel('Method').click();
      await page.getByRole('option', { name: run.method }).click();
      await dialog.getByLabel('Line or tank').fill(run.kind === 'passivation' ? 'Tank P1' : 'Ultrasonic U1');
      for (const [label, value] of Object.entries(run.values))
        await dialog.getByLabel(label, { exact: false }).first().pressSequentially(value, { delay: 40 });
      // Each value is judged against the method's window as it is typed; the server still decides.
      if (run.kind === 'passivation')
        await expect(dialog.getByTestId('window-temperature')).toHaveText('Within window');
      else
        await expect(dialog.getByTestId('window-washTemperature')).toHaveText(
          'Outside window: 63 °C is above the maximum 60 °C. Recording it raises a nonconformance on each lot ' +
            'in the run.',
        );
      const lots = dialog.getByRole('listbox', { name: /Lots in the run/ });
      for (const lot of [lotNumber, ...companions]) {
        await dialog.getByPlaceholder('Find a lot by number or part').fill(lot);
        await lots.getByRole('option', { name: new RegExp(`^${lot} `) }).click();
      }
      await expect(dialog.getByText(`3 chosen: ${[lotNumber, ...companions].join(', ')}.`)).toBeVisible();
      await dialog.getByRole('button', { name: 'Record run' }).click();
      await expect(
        page.getByRole('heading', {
          level: 1,
          name: new RegExp(`${run.kind === 'passivation' ? 'Passivation' : 'Cleaning'} run`),
        }),
      ).toBeVisible();
    }
    await expect(page.getByText('63 °C is above the maximum 60 °C')).toBeVisible();
    await expect(
      page.getByRole('region', { name: 'Nonconformances raised by this run' }).getByRole('listitem'),
    ).toHaveCount(3);
    await page.screenshot({ path: 'test-results/run-out-of-window.png', fullPage: true });

    // Back on the lot: the run's nonconformance is there; the engineer raises one more.
    await page.getByRole('link', { name: lotNumber }).click();
    await expect(page.getByRole('region', { name: 'Nonconformances touching this lot' })).toContainText(
      'ran outside its window',
    );
    await page.getByRole('button', { name: 'Raise a nonconformance' }).click();
    const raise = await openedDialog(page, /Raise a nonconformance/);
    await raise.getByLabel('What is wrong').fill('Two parts with a scratched thread found at visual check');
    await raise.getByLabel('Containment').fill('Lot held on rack Q2 pending disposition');
    await raise.getByRole('button', { name: 'Raise nonconformance' }).click();
    const ncHeading = page.getByRole('heading', { level: 1, name: /^NC-\d{4}-\d{4}/ });
    await expect(ncHeading).toBeVisible();
    const ncPath = new URL(page.url()).pathname;

    // A QA approver decides the disposition and closes it, each with a signature.
    await signInAs(page, 'kiw-0301', ncPath);
    await page.getByLabel('Decision').click();
    await page.getByRole('option', { name: 'Rework', exact: true }).click();
    await page.getByLabel('Justification').fill('Re-chase the threads of the two parts and re-inspect them');
    await page.getByRole('button', { name: 'Save disposition' }).click();
    await expect(page.getByRole('button', { name: 'Sign the disposition' })).toBeEnabled();
    await page.getByRole('button', { name: 'Sign the disposition' }).click();
    await signWithPassword(page, 'Disposition decided', 'Joaquín Ferreira — Disposition decided', 'joaquin-demo');
    await page.getByRole('button', { name: 'Close with a signature' }).click();
    await signWithPassword(
      page,
      'Closed',
      'Joaquín Ferreira — Closed',
      'joaquin-demo',
      'Rework done; both parts re-inspected and accepted',
    );
    await expect(page.getByRole('heading', { level: 1, name: /^NC-/ })).toContainText('Closed');
    await page.screenshot({ path: 'test-results/nonconformance-closed.png', fullPage: true });
  },
);
