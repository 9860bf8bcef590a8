import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { homeSchema } from '@shared/schemas/home';
import { createTestApp } from '../helpers/test-app';
import { SamlTestDriver } from '../helpers/saml-round-trip';

describe('a person’s home: the work waiting for their role, and the plant’s figures', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
  });
  afterAll(() => running.close());

  const homeOf = async (subject: string) =>
    homeSchema.parse((await (await saml.signIn(running.app, subject)).agent.get('/api/home')).body);
  const count = async (sql: string) => Number((await running.database.dataSource.query(sql))[0].count);

  it('when each role opens its home, then it sees the work its role may do, and only that', async () => {
    const keys = async (subject: string) => (await homeOf(subject)).work.map((item) => item.key);
    expect(await keys('kiw-0102')).toEqual(['check-analyses-due', 'lots-in-work', 'lots-returned']);
    expect(await keys('kiw-0201')).toEqual(['heats-to-disposition', 'lots-to-review', 'recalls-open', 'drills-open']);
    expect(await keys('kiw-0301')).toEqual(
      expect.arrayContaining([
        'lots-to-approve',
        'nonconformances-to-disposition',
        'nonconformances-to-close',
        'holds-to-lift',
      ]),
    );
    expect(await keys('kiw-0301')).not.toContain('lots-to-review');
    expect(await keys('kiw-0601')).toContain('role-changes');
    expect(await keys('kiw-0601')).not.toContain('lots-to-approve');
  });

  it('when the counts are shown, then each is what the records hold', async () => {
    const approver = await homeOf('kiw-0301');
    const item = (key: string) => approver.work.find((entry) => entry.key === key)!;
    expect(item('lots-to-approve').count).toBe(
      await count("SELECT COUNT(*) AS count FROM production_lot WHERE status = 'reviewed'"),
    );
    expect(item('nonconformances-to-disposition').count).toBe(
      await count("SELECT COUNT(*) AS count FROM nonconformance WHERE status = 'open'"),
    );
    expect(item('holds-to-lift').count).toBe(
      await count('SELECT COUNT(*) AS count FROM lot_hold WHERE lifted_at IS NULL'),
    );
    expect(item('lots-to-approve')).toMatchObject({ link: '/release', title: 'Lots to approve for release' });
  });

  it('when the plant figures are shown, then they cover the past year and add up to the records', async () => {
    const { figures } = await homeOf('kiw-0401');
    expect(figures).not.toBeNull();
    const raisedSince = await count(
      `SELECT COUNT(*) AS count FROM nonconformance WHERE raised_at >= '${figures!.sinceDay}'`,
    );
    expect(figures!.nonconformances.byCause.reduce((sum, entry) => sum + entry.count, 0)).toBe(raisedSince);
    expect(figures!.nonconformances.bySupplier.reduce((sum, entry) => sum + entry.count, 0)).toBe(
      figures!.nonconformances.byCause.reduce((sum, entry) => sum + entry.count, 0),
    );
    expect(figures!.releaseLeadTime.every((month) => /^\d{4}-\d{2}$/.test(month.month) && month.medianDays >= 0)).toBe(
      true,
    );
    expect(
      figures!.firstPassYield.every((part) => part.percent > 0 && part.percent <= 100 && part.good <= part.started),
    ).toBe(true);
    expect(figures!.firstPassYield.length).toBeGreaterThan(0);
  });
});
