import { expect, test } from '@playwright/test';
import { signInAs } from './support/sign-in';

test(
  '[E2E-TRACE] an auditor scans a UDI and reaches the bar, the heat and its certificate; then sees what that ' +
    'heat touches',
  async ({ page }) => {
    await signInAs(page, 'kiw-0401', '/lots');
    // Signed in once the lots page shows; the API calls below use the same session.
    await expect(page.getByRole('heading', { level: 1, name: 'Production lots' })).toBeVisible();
    const lots = await (await page.request.get('/api/lots?status=released&pageSize=1')).json();
    const lot = lots.items[0];
    const detail = await (await page.request.get(`/api/lots/${lot.id}`)).json();
    const udi = `(01)${detail.partRecord.gtin}(10)${lot.lotNumber}`;
    await page.goto('/trace');
    await page.getByLabel('UDI, lot number or bar tag').fill(udi);
    await page.getByRole('button', { name: 'Trace back' }).click();
    await expect(page.getByRole('heading', { name: `From UDI ${udi}` })).toBeVisible();
    const material = page.getByRole('region', { name: 'Material' });
    await expect(material.getByRole('link', { name: lot.heats[0], exact: true })).toBeVisible();
    await expect(material).toContainText(/[0-9a-f]{64}/);
    await page.screenshot({ path: 'test-results/trace-backward.png', fullPage: true });
    await material.getByRole('link', { name: lot.heats[0], exact: true }).click();
    await page.getByRole('link', { name: 'What does this heat touch?' }).click();
    await expect(page.getByRole('heading', { name: `From heat ${lot.heats[0]}` })).toBeVisible();
    await expect(page.getByRole('region', { name: 'Affected lots' })).toContainText(lot.lotNumber);
    await expect(page.getByRole('region', { name: 'Consignees' })).toBeVisible();
    await page.screenshot({ path: 'test-results/trace-forward.png', fullPage: true });

    // The same set as a graph: every record drawn, runs can be left out, and the view stays in the address.
    const graph = await (
      await page.request.get(`/api/trace/forward/graph?heatId=${new URL(page.url()).searchParams.get('heatId')}`)
    ).json();
    await page.getByRole('group', { name: 'Show as' }).getByRole('button', { name: 'Graph' }).click();
    await expect(page).toHaveURL(/view=graph/);
    const drawn = page.getByRole('region', { name: 'Genealogy graph' });
    await expect(drawn.getByRole('status')).toHaveText(
      `Showing ${graph.nodes.length} of ${graph.nodes.length} records and their links`,
    );
    await expect(drawn.locator('canvas').first()).toBeVisible();
    const runs = graph.nodes.filter((node: { kind: string }) => node.kind === 'run').length;
    await drawn.getByText('Runs', { exact: true }).click();
    await expect(drawn.getByRole('status')).toHaveText(
      `Showing ${graph.nodes.length - runs} of ${graph.nodes.length} records and their links`,
    );
    await expect(drawn.getByRole('list', { name: 'Legend' })).toContainText('Heat');
    await page.screenshot({ path: 'test-results/trace-graph.png', fullPage: true });
  },
);
