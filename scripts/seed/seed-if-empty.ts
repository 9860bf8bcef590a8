import type { AppConfig } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { isDatabaseEmpty, seedDemoScenario } from './demo-scenario';
import { seedDemoMaterials } from './demo-materials';
import { seedDemoManufacturing } from './demo-manufacturing';
import { seedDemoRelease } from './demo-release';
import { seedDemoDrill } from './demo-drill';
import { checkpointLedger, checkpointTriggers } from '../../server/src/modules/ledger/ledger-checkpoints';

/** Seeds the demo scenario if the database holds no organisation yet; returns whether it seeded. */
export async function seedIfEmpty(config: AppConfig): Promise<boolean> {
  const dataSource = createDataSource(config, 'app');
  await dataSource.initialize();
  try {
    if (!(await isDatabaseEmpty(dataSource))) return false;
    // Months of demo releases are replayed in seconds: one checkpoint at the end witnesses them all.
    checkpointTriggers.onRelease = false;
    try {
      await seedDemoScenario(dataSource, config.roleMap);
      await seedDemoMaterials(dataSource);
      await seedDemoManufacturing(dataSource);
      await seedDemoRelease(dataSource);
      await seedDemoDrill(dataSource);
    } finally {
      checkpointTriggers.onRelease = true;
    }
    await checkpointLedger(dataSource, config, 'seed');
    return true;
  } finally {
    await dataSource.destroy();
  }
}
