import type { EntityManager } from 'typeorm';

const tables = {
  production_lot: 'lot_number',
  nonconformance: 'nc_number',
  process_run: 'run_number',
  recall_investigation: 'recall_number',
} as const;

/**
 * The next running number among the record numbers that share a prefix (and suffix). The locking
 * read holds the range until the transaction ends, so two people opening lots at once get
 * different numbers rather than a clash.
 */
export async function nextSequence(
  manager: EntityManager,
  table: keyof typeof tables,
  prefix: string,
  suffix = '',
): Promise<number> {
  const column = tables[table];
  const like = `${prefix.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
  const rows: Array<{ value: string }> = await manager.query(
    `SELECT ${column} AS value FROM ${table} WHERE ${column} LIKE ? FOR UPDATE`,
    [like],
  );
  let highest = 0;
  for (const { value } of rows) {
    if (!value.endsWith(suffix)) continue;
    const middle = value.slice(prefix.length, value.length - suffix.length);
    if (/^\d+$/.test(middle)) highest = Math.max(highest, Number(middle));
  }
  return highest + 1;
}
