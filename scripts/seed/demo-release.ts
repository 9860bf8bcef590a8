import type { DataSource } from 'typeorm';
import { shipmentInputSchema } from '../../shared/schemas/manufacturing';
import { labelMovementSchema } from '../../shared/schemas/release';
import type { Person } from '@shared/schemas/people';
import { findPersonBySubject } from '../../server/src/modules/people/people.repository';
import { recordLabels, submitForRelease } from '../../server/src/modules/release/release.service';
import { releaseDossier } from '../../server/src/modules/release/release-dossier';
import { shipLot } from '../../server/src/modules/manufacturing/shipments.service';
import { generator } from './demo-heat-history';
import { signAsDemoPerson } from './demo-signature';

const origin = { requestId: 'demo-seed', clientAddress: null };
const DAY = 86_400_000;

/**
 * Releases in the demo: the finished lots get their labels, are submitted, reviewed and approved
 * for release (seeded signatures), and ship to one to three consignees. The newest finished lots
 * wait in the review and approval queues.
 */
export async function seedDemoRelease(dataSource: DataSource): Promise<void> {
  const engineer = (await findPersonBySubject(dataSource.manager, 'kiw-0101')) as Person;
  const actor = { id: engineer.id, name: engineer.name, role: 'manufacturing-engineer' };
  const random = generator(8_2026);
  const finished: Array<{ id: number; opened_at: Date }> = await dataSource.query(
    `SELECT l.id, l.opened_at FROM production_lot l
      WHERE l.status = 'open' AND NOT EXISTS (
        SELECT 1 FROM routing_step s WHERE s.part_id = l.part_id AND s.step_no > l.resumes_after_step
           AND NOT EXISTS (SELECT 1 FROM lot_operation o WHERE o.lot_id = l.id AND o.routing_step_id = s.id))
      ORDER BY l.opened_at, l.id`,
  );
  const consignees: Array<{ id: number }> = await dataSource.query('SELECT id FROM consignee ORDER BY id');
  const waitingForReview = finished.slice(-3);
  const waitingForApproval = finished.slice(-6, -3);
  for (const [index, lot] of finished.entries()) {
    const dossier = await releaseDossier(dataSource, lot.id);
    const units = dossier.lot.onHand ?? 0;
    if (units < 1) continue;
    await recordLabels(
      dataSource,
      lot.id,
      labelMovementSchema.parse({ kind: 'print', qty: units + (index % 7 === 0 ? 1 : 0) }),
      engineer,
      actor,
      origin,
    );
    if (index % 7 === 0)
      await recordLabels(
        dataSource,
        lot.id,
        labelMovementSchema.parse({ kind: 'void', qty: 1, reason: 'Label smudged at printing; destroyed' }),
        engineer,
        actor,
        origin,
      );
    if (!(await releaseDossier(dataSource, lot.id)).readiness.ready) continue;
    await submitForRelease(dataSource, lot.id, engineer, actor, origin);
    if (waitingForReview.includes(lot)) continue;
    await signAsDemoPerson(dataSource, 'kiw-0201', {
      recordType: 'lot-release',
      recordId: String(lot.id),
      meaning: 'reviewed',
    });
    if (waitingForApproval.includes(lot)) continue;
    await signAsDemoPerson(dataSource, 'kiw-0301', {
      recordType: 'lot-release',
      recordId: String(lot.id),
      meaning: 'approved-for-release',
    });
    // Shipments: the released units go to one to three consignees within weeks of the lot's end.
    let left = units - (random() < 0.25 ? Math.ceil(units * 0.2) : 0);
    const shipTo = 1 + Math.floor(random() * 3);
    for (let shipment = 0; shipment < shipTo && left > 0; shipment++) {
      const qty = shipment === shipTo - 1 ? left : Math.max(1, Math.floor(left / 2));
      const shippedOn = new Date(
        Math.min(Date.now(), new Date(lot.opened_at).getTime() + (20 + shipment * 9 + Math.floor(random() * 10)) * DAY),
      )
        .toISOString()
        .slice(0, 10);
      const consignee = consignees[Math.floor(random() * consignees.length)]!;
      await shipLot(
        dataSource,
        lot.id,
        shipmentInputSchema.parse({
          consigneeId: consignee.id,
          qty,
          shippedOn,
          documentNumber: `DN-${shippedOn.replace(/-/g, '').slice(2)}-${String(lot.id).padStart(4, '0')}${shipment}`,
        }),
        engineer,
        actor,
        origin,
      );
      left -= qty;
    }
  }
  await dropDemoHistoryMail(dataSource);
}

/**
 * The demo's history sent no mail: its queued notifications are dropped, except those for the
 * lots still waiting in the release queues, which the mail catcher then shows.
 */
export async function dropDemoHistoryMail(dataSource: DataSource): Promise<void> {
  await dataSource.query(
    `DELETE FROM mail_outbox WHERE sent_at IS NULL AND entity_type = 'lot'
       AND CAST(entity_id AS UNSIGNED) NOT IN (SELECT id FROM production_lot WHERE status IN ('submitted',
         'reviewed'))`,
  );
}
