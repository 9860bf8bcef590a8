import type { DataSource } from 'typeorm';
import { parse } from 'csv-parse/sync';
import { readChemistryValue, readMechanicalValue, ReportedValueError } from '@shared/domain/materials/reported-value';
import type { ResultsImport, ResultsImportReport } from '@shared/schemas/materials';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import type { Actor, RequestOrigin } from '../ledger/ledger.repository';
import { recordResultsIn } from './heats.service';
import { heatOfSupplierNamed } from './heats.repository';

/** The file's columns for mechanical properties, in the same lower-case style as its other columns, with the unit. */
const mechanicalColumns = {
  uts_mpa: 'utsMPa',
  ys_mpa: 'ysMPa',
  elongation_pct: 'elongationPct',
  reduction_of_area_pct: 'reductionOfAreaPct',
} as const;
const mechanicalNames = Object.keys(mechanicalColumns);
const isMechanical = (column: string): column is keyof typeof mechanicalColumns => mechanicalNames.includes(column);
const required = ['supplier', 'heat_number'];

interface CheckedRow {
  line: number;
  heatId: number;
  heatNumber: string;
  chemistry: Record<string, string>;
  mechanical: Record<string, string>;
}

/**
 * Imports certificate results from CSV: one row per heat, columns supplier, heat_number, then
 * element symbols (wt %, or "45 ppm") and uts_mpa, ys_mpa, elongation_pct, reduction_of_area_pct.
 * Every bad row is reported with its line and field; nothing is written unless every row is valid
 * or the person chose to import only the valid rows; what is written is written in one transaction.
 */
export async function importResults(
  dataSource: DataSource,
  request: ResultsImport,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<ResultsImportReport> {
  let records: Record<string, string>[];
  try {
    records = parse(request.csv, {
      columns: (header: string[]) => header.map((name) => name.trim()),
      skip_empty_lines: true,
      trim: true,
      bom: true,
      relax_column_count: false,
    });
  } catch (error) {
    throw new AppError(
      'VALIDATION_FAILED',
      `The file is not readable CSV: ${error instanceof Error ? error.message : String(error)}`,
      { csv: 'Not CSV' },
    );
  }
  const header = records[0] ? Object.keys(records[0]) : [];
  const missing = required.filter((column) => !header.includes(column));
  if (records.length === 0) throw new AppError('VALIDATION_FAILED', 'The file has no data rows', { csv: 'No rows' });
  if (missing.length)
    throw new AppError('VALIDATION_FAILED', `The header lacks ${missing.join(', ')}`, {
      csv: `Add the columns ${missing.join(', ')}`,
    });
  const unknown = header.filter(
    (column) => !required.includes(column) && !/^[A-Z][a-z]?$/.test(column) && !isMechanical(column),
  );
  if (unknown.length)
    throw new AppError('VALIDATION_FAILED', `Unknown columns: ${unknown.join(', ')}`, {
      csv: `Columns are supplier, heat_number, element symbols and ${mechanicalNames.join(', ')}`,
    });

  const errors: ResultsImportReport['errors'] = [];
  const checked: CheckedRow[] = [];
  const seen = new Set<string>();
  for (const [index, record] of records.entries()) {
    const line = index + 2;
    const rowErrors: ResultsImportReport['errors'] = [];
    const heat = await heatOfSupplierNamed(dataSource.manager, record.supplier ?? '', record.heat_number ?? '');
    if (!heat)
      rowErrors.push({ line, field: 'heat_number', message: `No heat ${record.heat_number} from ${record.supplier}` });
    else if (heat.status === 'accepted' || heat.status === 'rejected')
      rowErrors.push({
        line,
        field: 'heat_number',
        message: `Heat ${record.heat_number} is ${heat.status}; its results can no longer change`,
      });
    const key = `${record.supplier}\u0000${record.heat_number}`;
    if (seen.has(key))
      rowErrors.push({ line, field: 'heat_number', message: `Heat ${record.heat_number} appears twice in the file` });
    seen.add(key);
    const chemistry: Record<string, string> = {};
    const mechanical: Record<string, string> = {};
    for (const [column, value] of Object.entries(record)) {
      if (required.includes(column) || value === '') continue;
      try {
        if (isMechanical(column)) mechanical[mechanicalColumns[column]] = readMechanicalValue(value);
        else {
          readChemistryValue(value);
          chemistry[column] = value;
        }
      } catch (error) {
        if (error instanceof ReportedValueError) rowErrors.push({ line, field: column, message: error.message });
        else throw error;
      }
    }
    errors.push(...rowErrors);
    if (rowErrors.length === 0 && heat)
      checked.push({ line, heatId: heat.id, heatNumber: record.heat_number!, chemistry, mechanical });
  }

  const report: ResultsImportReport = {
    rows: records.length,
    valid: checked.length,
    imported: 0,
    errors,
    verdicts: [],
  };
  if (request.mode === 'check' || checked.length === 0) return report;
  if (request.mode === 'all' && errors.length) {
    throw new AppError(
      'RULE_VIOLATION',
      `Nothing was imported: ${errors.length} problem(s) in ${records.length - checked.length} row(s); fix ` +
        `them or import only the valid rows`,
    );
  }
  await inTransaction(dataSource, async (manager) => {
    report.verdicts = [];
    for (const row of checked) {
      const verdict = await recordResultsIn(
        manager,
        row.heatId,
        { chemistry: row.chemistry, mechanical: row.mechanical, reason: 'imported from CSV' },
        person,
        actor,
        origin,
      );
      report.verdicts.push({ line: row.line, heatNumber: row.heatNumber, verdict });
    }
  });
  report.imported = checked.length;
  return report;
}
