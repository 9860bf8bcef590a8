import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { createRequire } from 'node:module';
import { loadConfig } from '../../server/src/config/env';
import { signInAs } from './support/sign-in';
import { signWithPassword } from './support/signing';
import { openedDialog } from './support/dialogs';
import { expectAccessible } from './support/accessibility';

// epcis2.js is CommonJS; Playwright's loader does not see its named exports through an import.
const { validateEpcisDocument } = createRequire(import.meta.url)('epcis2.js') as typeof import('epcis2.js');
const mailCatcher = `http://127.0.0.1:${loadConfig().MAIL_WEB_PORT}`;
const escape = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
const newConsignee = 'Fjellmark Day Surgery (journey)';
const newAddress = 'recalls@fjellmark-day-surgery.example';

/** The consignee opens its mail: the notice in the mail catcher, as its mail program would show it. */
async function noticeMailTo(page: Page, address: string, subject: string): Promise<string> {
  let text = '';
  await expect
    .poll(
      async () => {
        const mails = (await (await page.request.get(`${mailCatcher}/api/email`)).json()) as Array<{
          subject: string;
          text: string;
          to: Array<{ address: string }>;
        }>;
        text =
          mails.find((mail) => mail.subject === subject && mail.to.some((to) => to.address === address))?.text ?? '';
        return text.length > 0;
      },
      { timeout: 30_000 },
    )
    .toBe(true);
  return text;
}

test(
  '[E2E-FIELD-ACTION] a coordinator sends signed notices, a consignee answers through its own link on a phone, and ' +
    'the effectiveness figure moves',
  async ({ page, browser }) => {
    test.setTimeout(240_000);
    page.setDefaultTimeout(20_000);

    // A new consignee, with the address its notices go to.
    await signInAs(page, 'kiw-0102', '/consignees');
    await expect(page.getByRole('heading', { level: 1, name: 'Consignees' })).toBeVisible();
    await page.getByRole('button', { name: 'Add a consignee' }).click();
    const adding = await openedDialog(page, 'Add a consignee');
    await adding.getByLabel('Name').pressSequentially(newConsignee, { delay: 40 });
    await adding.getByLabel('Country').pressSequentially('Norway', { delay: 40 });
    await adding.getByRole('button', { name: 'Add', exact: true }).click();
    await expect(page.getByRole('cell', { name: newConsignee, exact: true })).toBeVisible();
    // The address its recall notices go to, recorded afterwards; a wrong one is refused at its field.
    await page.getByRole('button', { name: `Change where recall notices to ${newConsignee} go` }).click();
    const address = await openedDialog(page, `Recall notices to ${newConsignee}`);
    await address.getByLabel('Contact e-mail').pressSequentially('recalls at fjellmark', { delay: 40 });
    await address.getByRole('button', { name: 'Save address' }).click();
    await expect(address.getByText('An e-mail address')).toBeVisible();
    await address.getByLabel('Contact e-mail').fill('');
    await address.getByLabel('Contact e-mail').pressSequentially(newAddress, { delay: 40 });
    await address.getByRole('button', { name: 'Save address' }).click();
    await expect(address).toBeHidden();
    await expect(page.getByRole('row', { name: new RegExp(escape(newConsignee)) })).toContainText(newAddress);

    // A lot waiting for approval is approved, so that it can ship to the new consignee.
    await signInAs(page, 'kiw-0301', '/release');
    await page.getByRole('tab', { name: /^Awaiting approval/ }).click();
    // The longest-waiting lot: lots other journeys bring to approval come after it.
    const waiting = page.locator('table').getByRole('link').first();
    const lotNumber = (await waiting.textContent())!.trim();
    await waiting.click();
    await page.getByRole('button', { name: 'Approve for release' }).click();
    await signWithPassword(page, 'Approved for release', 'Joaquín Ferreira — Approved for release', 'joaquin-demo');
    await expect(page.getByRole('heading', { level: 1, name: new RegExp(`^Lot ${escape(lotNumber)}`) })).toContainText(
      'Released',
    );

    await signInAs(page, 'kiw-0102', '/lots');
    await page.getByLabel('Search lots').pressSequentially(lotNumber, { delay: 60 });
    await page.getByRole('link', { name: lotNumber, exact: true }).click();
    await page.getByRole('button', { name: 'Record a shipment' }).click();
    const ship = await openedDialog(page, /Ship/);
    await ship.getByLabel('Consignee').click();
    await page.getByRole('option', { name: newConsignee }).click();
    await ship.getByLabel('Units').pressSequentially('6', { delay: 80 });
    await ship.getByLabel('Shipping document number').pressSequentially('DN-JOURNEY-1', { delay: 40 });
    await ship.getByRole('button', { name: 'Record shipment' }).click();
    await expect(ship).toBeHidden();
    const heatNumber = (await page
      .locator('dt', { hasText: /^Heats$/ })
      .locator('xpath=following-sibling::dd[1]')
      .textContent())!
      .split(',')[0]!
      .trim();

    // The coordinator opens a recall from the lot's heat.
    await signInAs(page, 'kiw-0501', '/trace');
    await page.getByRole('tab', { name: 'What does this touch?' }).click();
    await page
      .getByRole('combobox', { name: 'Start from a heat, bar, run, supplier or part' })
      .pressSequentially(heatNumber, { delay: 80 });
    await page.getByRole('option', { name: new RegExp(`^Heat ${escape(heatNumber)}`) }).click();
    await page.getByRole('button', { name: 'Trace forward' }).click();
    await page.getByRole('button', { name: 'Open a recall investigation' }).click();
    const opening = await openedDialog(page, 'Open a recall investigation');
    await opening
      .getByLabel('Why is it opened?')
      .pressSequentially('Mill reports a lap in bars of this heat; recalling every unit made from it', { delay: 20 });
    await opening.getByRole('button', { name: 'Open investigation and hold lots' }).click();
    const title = page.getByRole('heading', { level: 1, name: /^Recall investigation RC-\d{4}-\d{4}$/ });
    await expect(title).toBeVisible();
    const recallNumber = ((await title.textContent()) ?? '').replace('Recall investigation ', '');

    // The field action: the level the strategy names, the action asked, the firm's text.
    const notices = page.getByRole('region', { name: 'Consignee notices' });
    await expect(notices.getByTestId('notices-caution')).toContainText('regulatory function');
    await notices.getByRole('combobox', { name: /^Effectiveness check level/ }).click();
    await page.getByRole('option', { name: 'Level A: 100 % of consignees' }).click();
    const template = notices.getByLabel("Notice text (your firm's template)");
    // A field the product does not know is flagged while typing.
    await template.press('End');
    await template.pressSequentially(' {{portal}}', { delay: 60 });
    await expect(notices.getByText(/Unknown field \{\{portal\}\}/)).toBeVisible();
    for (let key = 0; key < ' {{portal}}'.length; key++) await template.press('Backspace');
    await expect(notices.getByText(/Unknown field/)).toHaveCount(0);
    await notices
      .getByLabel('Action asked of each consignee')
      .pressSequentially('Stop using these units, quarantine them and return them to us.', { delay: 20 });
    await notices.getByRole('button', { name: 'Save field action' }).click();
    await notices.getByRole('button', { name: 'Prepare notices' }).click();
    const row = notices
      .getByRole('table', { name: 'Notices' })
      .getByRole('row', { name: new RegExp(escape(newConsignee)) });
    await expect(row).toContainText(newAddress);
    await row.getByRole('button', { name: `Preview the notice to ${newConsignee}` }).click();
    const preview = await openedDialog(page, `Notice to ${newConsignee}`);
    await expect(preview.getByTestId('notice-text')).toContainText(`Lot ${lotNumber}`);
    await expect(preview.getByTestId('notice-text')).toContainText('6 units shipped to you');
    await expect(preview.getByTestId('notice-text')).toContainText('/reply/');
    await preview.screenshot({ path: 'test-results/field-action-notice-preview.png' });
    await preview.getByRole('button', { name: 'Close' }).click();
    await expectAccessible(page, 'recall page with notices prepared');

    // Issuing is the coordinator's signature.
    await notices.getByRole('button', { name: /^Issue \d+ notices? with signature$/ }).click();
    await expect(page.getByRole('dialog', { name: 'Sign: Notices issued' })).toContainText(newConsignee);
    await signWithPassword(
      page,
      'Notices issued',
      'Oluwaseun Adeyemi — Notices issued',
      'oluwaseun-demo',
      undefined,
      90,
    );
    await expect(row).toContainText('issued');
    const replied = notices.getByTestId('effectiveness-replied');
    await expect(replied).toContainText(/^0 of \d+/);
    const unitsBefore = (await notices.getByTestId('effectiveness-units').textContent())!;
    await expect(notices.getByTestId('unanswered')).toContainText(newConsignee);
    await page.screenshot({ path: 'test-results/field-action-issued.png', fullPage: true });

    // The consignee reads its mail and answers on a phone, with no account.
    const mail = await noticeMailTo(page, newAddress, `Medical device recall ${recallNumber}`);
    const link = /https?:\/\/\S+\/reply\/[A-Za-z0-9_-]{43}/.exec(mail)![0];
    const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const consignee = await phone.newPage();
    await consignee.goto(new URL(link).pathname);
    await expect(
      consignee.getByRole('heading', { level: 1, name: `Recall ${recallNumber}: your answer` }),
    ).toBeVisible();
    await expect(consignee.getByText(newConsignee)).toBeVisible();
    await consignee.waitForTimeout(2_000);
    const lot = consignee.getByRole('group', { name: new RegExp(`Lot ${escape(lotNumber)}`) });
    await lot.getByLabel('Still on hand').pressSequentially('1', { delay: 150 });
    await lot.getByLabel('Returned to us').pressSequentially('9', { delay: 150 });
    await expect(consignee.getByText('These add up to 10; 6 units were shipped to you')).toBeVisible();
    await lot.getByLabel('Returned to us').press('Backspace');
    await lot.getByLabel('Returned to us').pressSequentially('2', { delay: 150 });
    await lot.getByLabel('Destroyed').pressSequentially('0', { delay: 150 });
    await lot.getByLabel('Already used or implanted').pressSequentially('3', { delay: 150 });
    await expect(lot).toContainText('Accounted for: 6 of 6');
    await consignee.getByLabel('Your name').pressSequentially('Sister Marit Aasen', { delay: 70 });
    await consignee.getByRole('button', { name: 'Send answer' }).click();
    await expect(consignee.getByText('Thank you. Your answer was recorded')).toBeVisible();
    expect(await consignee.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    await consignee.waitForFunction(() =>
      document.getAnimations().every((animation) => animation.playState !== 'running'),
    );
    await consignee.screenshot({ path: 'test-results/field-action-reply-phone.png', fullPage: true });
    await expectAccessible(consignee, 'consignee reply page on a phone');
    // A link that is not one shows a plain page and nothing of any record.
    await consignee.goto(`/reply/${'x'.repeat(43)}`);
    await expect(consignee.getByRole('heading', { level: 1, name: 'This link does not open a notice' })).toBeVisible();
    await expect(consignee.locator('body')).not.toContainText(recallNumber);
    await consignee.screenshot({ path: 'test-results/field-action-reply-wrong-link.png' });
    await phone.close();

    // The coordinator sees the answer move the figures.
    await page.reload();
    await expect(replied).toContainText(/^1 of \d+/);
    await expect(notices.getByTestId('effectiveness-units')).not.toHaveText(unitsBefore);
    await expect(notices.getByTestId('unanswered')).not.toContainText(newConsignee);
    await expect(row).toContainText('Sister Marit Aasen');
    await notices.getByRole('heading', { name: 'Units accounted for over time' }).scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'test-results/field-action-effectiveness.png', fullPage: true });
    await expectAccessible(page, 'recall page after a consignee answered');

    // The units the consignee returned arrive: counted against it and the lot, and the lot held.
    await notices.getByRole('button', { name: 'Receive returned goods' }).click();
    const receiving = await openedDialog(page, 'Receive returned goods');
    await receiving.getByRole('combobox', { name: 'Returned by' }).click();
    await page.getByRole('option', { name: newConsignee }).click();
    await expect(receiving.getByRole('combobox', { name: 'Lot' })).toContainText(lotNumber);
    await receiving.getByLabel('Units received').pressSequentially('9', { delay: 120 });
    await receiving.getByLabel('Note (optional: condition, carrier, box)').click();
    await expect(receiving.getByText('Only 6 units of this lot were shipped to this consignee')).toBeVisible();
    await receiving.getByLabel('Units received').fill('');
    await receiving.getByLabel('Units received').pressSequentially('2', { delay: 120 });
    await receiving
      .getByLabel('Note (optional: condition, carrier, box)')
      .pressSequentially('Sealed pouches, carrier TNX', { delay: 30 });
    await receiving.getByRole('button', { name: 'Receive and hold' }).click();
    await expect(receiving).toBeHidden();
    await expect(notices.getByRole('region', { name: 'Returned goods received' })).toContainText('Sealed pouches');
    await expect(notices.getByTestId('balance-differences')).toHaveCount(0);

    // A QA approver lifts each hold after its disposition; the level is not met, so closing takes a signed
    // justification, signed over the figures as they stand. The consignee's link then opens nothing.
    await signInAs(page, 'kiw-0301', page.url().replace(/^https?:\/\/[^/]+/, ''));
    const lift = page.getByRole('region', { name: 'Holds' }).getByRole('button', { name: /^Lift the hold on / });
    await expect(lift.first()).toBeVisible();
    while ((await lift.count()) > 0) {
      await lift.first().click();
      await signWithPassword(
        page,
        'Hold lifted',
        'Joaquín Ferreira — Hold lifted',
        'joaquin-demo',
        'Units scrapped under NC',
      );
    }
    await page.getByRole('button', { name: 'Close with signed justification' }).click();
    const closing = page.getByRole('dialog', {
      name: 'Sign: Closed below the effectiveness level, with justification',
    });
    await expect(closing).toContainText('Effectiveness of the field action');
    await expect(closing).toContainText(/Replies needed\s*\d+/);
    await closing.screenshot({ path: 'test-results/field-action-close-justified.png' });
    await signWithPassword(
      page,
      'Closed below the effectiveness level, with justification',
      'Joaquín Ferreira — Closed below the effectiveness level, with justification',
      'joaquin-demo',
      'Demo consignees are exercises; the one real answer accounts for every unit it received',
      30,
    );
    await expect(page.getByRole('heading', { level: 1, name: `Recall investigation ${recallNumber}` })).toBeVisible();
    await expect(page.locator('.tags')).toContainText('Closed');
    const after = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const late = await after.newPage();
    await late.goto(new URL(link).pathname);
    await expect(late.getByRole('heading', { level: 1, name: 'This link does not open a notice' })).toBeVisible();
    await after.close();

    // The scope, for a distributor's system, as EPCIS 2.0.
    const [epcis] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Export EPCIS 2.0' }).click(),
    ]);
    expect(epcis.suggestedFilename()).toBe(`${recallNumber}-epcis.jsonld`);
    const scope = JSON.parse(readFileSync((await epcis.path())!, 'utf8')) as {
      type: string;
      epcisBody: { eventList: unknown[] };
    };
    expect(validateEpcisDocument(scope, false)).toEqual({ success: true, errors: [] });
  },
);
