import { afterAll, describe, expect, it } from 'vitest';
import { specificationLibrary } from '@shared/domain/materials/library';
import { syncSpecificationLibrary } from '../../server/src/modules/materials/specification-library.repository';
import { createTestApp } from '../helpers/test-app';

describe('the specification library in the database', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it(
    'when the bootstrap has run, then every shipped ' + 'revision is stored once and a second sync adds nothing',
    async () => {
      const dataSource = await running.database.connect();
      const rows: Array<{ spec_id: string; revision: string }> = await dataSource.query(
        'SELECT spec_id, revision FROM specification_revision ORDER BY spec_id',
      );
      const stored = rows.map((row) => `${row.spec_id} ${row.revision}`);
      for (const specification of specificationLibrary)
        expect(stored.filter((entry) => entry === `${specification.id} ${specification.revision}`)).toHaveLength(1);
      expect(await dataSource.transaction((manager) => syncSpecificationLibrary(manager))).toEqual([]);
    },
  );

  it(
    'when a stored revision is shipped with different limits, ' + 'then the sync refuses and asks for a new revision',
    async () => {
      const dataSource = await running.database.connect();
      const changed = specificationLibrary.map((specification) =>
        specification.id === 'ASTM F136'
          ? {
              ...specification,
              grades: specification.grades.map((grade) => ({
                ...grade,
                chemistry: grade.chemistry.map((limit) => (limit.element === 'O' ? { ...limit, max: '0.20' } : limit)),
              })),
            }
          : specification,
      );
      await expect(dataSource.transaction((manager) => syncSpecificationLibrary(manager, changed))).rejects.toThrow(
        'Revision L2 of ASTM F136 in the shipped library differs from the stored one; stored revisions are ' +
          'immutable, so ship the change as a new revision',
      );
    },
  );

  it('[SPEC-IMMUTABLE] when the app account tries to change a stored revision, then MariaDB refuses', async () => {
    const dataSource = await running.database.connect();
    await expect(dataSource.query("UPDATE specification_revision SET edition = 'x'")).rejects.toThrow(
      /UPDATE command denied/,
    );
  });
});
