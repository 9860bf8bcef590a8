import type { DataSource } from 'typeorm';
import { openRecallInputSchema } from '../../shared/schemas/recall';
import { findPersonBySubject } from '../../server/src/modules/people/people.repository';
import { openRecall } from '../../server/src/modules/recall/recall.service';
import { signAsDemoPerson } from './demo-signature';

/**
 * One rehearsal on record: the recall coordinator traced the heat of the latest shipped lot to
 * its consignees and a QA approver signed the drill closed. Its durations are the seed's own
 * (seconds), not an invented story.
 */
export async function seedDemoDrill(dataSource: DataSource): Promise<void> {
  const coordinator = await findPersonBySubject(dataSource.manager, 'kiw-0501');
  if (!coordinator) throw new Error('seed the demo people first');
  const [heat]: Array<{ heat_id: number }> = await dataSource.query(
    'SELECT lh.heat_id FROM shipment s JOIN lot_heat lh ON lh.lot_id = s.lot_id ORDER BY s.shipped_on DESC, ' +
      's.id DESC LIMIT 1',
  );
  if (!heat) return;
  const drill = await openRecall(
    dataSource,
    openRecallInputSchema.parse({
      trigger: { heatId: heat.heat_id },
      mode: 'drill',
      reason: 'Half-yearly recall rehearsal: one heat to every consignee, timed',
    }),
    coordinator,
    { id: coordinator.id, name: coordinator.name, role: 'recall-coordinator' },
    { requestId: 'demo-seed', clientAddress: null },
  );
  await signAsDemoPerson(dataSource, 'kiw-0301', {
    recordType: 'recall-investigation',
    recordId: String(drill.id),
    meaning: 'closed',
    reason: 'Scope confirmed against shipping records and consignee contacts; every unit accounted for',
  });
}
