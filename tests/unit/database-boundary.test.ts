import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

// The lint rule that keeps SQL in repository files, tried on code it must refuse and code it must let pass.
const eslint = new ESLint();

const querying = `import type { EntityManager } from 'typeorm';
export async function lotCount(manager: EntityManager): Promise<number> {
  const rows: Array<{ total: number }> = await manager.query('SELECT COUNT(*) AS total FROM production_lot');
  return rows[0]?.total ?? 0;
}
`;

async function boundaryMessages(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return (result?.messages ?? []).filter((message) => message.ruleId === 'no-restricted-syntax').map((m) => m.message);
}

describe('the database boundary', () => {
  it('[DB-BOUNDARY] refuses SQL, a TypeORM repository or a query builder in a service or a router', async () => {
    expect(await boundaryMessages(querying, 'server/src/modules/manufacturing/lot-count.service.ts')).toEqual([
      'Database access (.query) belongs in a *.repository.ts file of the module.',
    ]);
    const viaRepository = `import type { EntityManager } from 'typeorm';
import { ProductionLot } from './entities/production-lot.entity';
export const openLots = (manager: EntityManager) => manager.getRepository(ProductionLot).countBy({ status: 'open' });
export const builder = (manager: EntityManager) => manager.createQueryBuilder(ProductionLot, 'lot');
`;
    expect(await boundaryMessages(viaRepository, 'server/src/modules/manufacturing/lots.router.ts')).toHaveLength(2);
  });

  it('[DB-BOUNDARY-REPOSITORY] lets the same code pass in a repository file', async () => {
    expect(await boundaryMessages(querying, 'server/src/modules/manufacturing/lot-count.repository.ts')).toEqual([]);
  });
});
