import type { DataSource } from 'typeorm';
import { Decimal } from 'decimal.js';
import { capability } from '@shared/domain/materials/capability';
import type { Trend, TrendQuery } from '@shared/schemas/materials';
import { AppError } from '../../errors';
import { currentSpecifications } from './specification-library.repository';
import { chemistryHistory } from './heats.repository';

/** One element's reported values per heat of one supplier and specification, over time, against its limit. */
export async function elementTrend(dataSource: DataSource, query: TrendQuery): Promise<Trend> {
  const manager = dataSource.manager;
  const specification = (await currentSpecifications(manager)).find((candidate) => candidate.id === query.specId);
  if (!specification) throw AppError.rule(`Unknown specification ${query.specId}`, { specId: 'Not in the library' });
  const grade =
    specification.grades.length === 1
      ? specification.grades[0]
      : specification.grades.find((candidate) => candidate.grade === query.grade);
  if (!grade)
    throw AppError.rule(`${specification.id} has grades; choose one`, {
      grade: specification.grades.map((candidate) => candidate.grade).join(', '),
    });
  const limit = grade.chemistry.find((candidate) => candidate.element === query.element);
  if (!limit)
    throw AppError.rule(`${specification.id} sets no limit for ${query.element}`, {
      element: 'No limit for this element',
    });
  const rows = await chemistryHistory(manager, {
    supplierId: query.supplierId,
    specId: specification.id,
    element: query.element,
    grade: specification.grades.length > 1 ? grade.grade : null,
  });
  const points = rows.map((row) => ({
    heatId: row.heat_id,
    heatNumber: row.heat_number,
    receivedAt: new Date(row.received_at).toISOString(),
    value: new Decimal(row.value).toFixed(),
  }));
  const text =
    limit.min !== undefined && limit.max !== undefined
      ? `${limit.min}–${limit.max}`
      : limit.max !== undefined
        ? `≤ ${limit.max}`
        : `≥ ${limit.min}`;
  return {
    element: query.element,
    limit: {
      ...(limit.min !== undefined ? { min: limit.min } : {}),
      ...(limit.max !== undefined ? { max: limit.max } : {}),
      text,
    },
    points,
    capability: capability(
      points.map((point) => point.value),
      limit,
    ),
  };
}
