/** The practices × measures table as rows: sorting and the CSV export (display only). */
import { flagShortText } from '../../../components/charts/flags';
import type { BenchmarkCell, Practice, RegionBenchmark } from '../../../lib/api/types';

export interface TableRow {
  practice: Practice;
  localityCode: string | null;
  /** null: no current submission (shown as missing, never as zero) */
  cells: (BenchmarkCell | null)[];
  dataQuality: number | null;
}

export type SortKey = 'practice' | 'quality' | `measure:${string}`;

export function tableRows(benchmark: RegionBenchmark): TableRow[] {
  const rows: TableRow[] = benchmark.practices.map((p) => ({
    practice: p.practice,
    localityCode: p.localityCode,
    cells: benchmark.measures.map((m) => p.cells.find((c) => c.measure === m.key) ?? null),
    dataQuality: p.dataQuality.reduce((sum, f) => sum + f.count, 0),
  }));
  for (const missing of benchmark.coverage.missing) {
    rows.push({
      practice: missing,
      localityCode: null,
      cells: benchmark.measures.map(() => null),
      dataQuality: null,
    });
  }
  return rows;
}

/** Sorted copy; missing values (no submission, no rate) always last. */
export function sortRows(
  rows: TableRow[],
  benchmark: RegionBenchmark,
  key: SortKey,
  descending: boolean,
): TableRow[] {
  const sign = descending ? -1 : 1;
  const index = key.startsWith('measure:')
    ? benchmark.measures.findIndex((m) => m.key === key.slice('measure:'.length))
    : -1;
  const value = (row: TableRow): number | string | null => {
    if (key === 'practice') return row.practice.code;
    if (key === 'quality') return row.dataQuality;
    return row.cells[index]?.rate ?? null;
  };
  return [...rows].sort((a, b) => {
    const va = value(a);
    const vb = value(b);
    if (va == null && vb == null) return a.practice.code.localeCompare(b.practice.code);
    if (va == null) return 1;
    if (vb == null) return -1;
    if (typeof va === 'string' || typeof vb === 'string') {
      return sign * String(va).localeCompare(String(vb));
    }
    return sign * (va - vb) || a.practice.code.localeCompare(b.practice.code);
  });
}

/** A spreadsheet would run a cell that begins with = + - @ as a formula: prefix a quote. */
export function neutraliseCell(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

function csvField(text: string): string {
  const safe = neutraliseCell(text);
  return /[",\n\r]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** The table as CSV: one row per practice; n, events, rate and flag per measure. */
export function tableCsv(benchmark: RegionBenchmark, rows: TableRow[]): string {
  const head = ['practice_code', 'practice_name', 'locality', 'data_quality_flags'];
  for (const m of benchmark.measures) {
    head.push(`${m.key}_n`, `${m.key}_events`, `${m.key}_rate`, `${m.key}_flag`);
  }
  const lines = [head.join(',')];
  for (const row of rows) {
    const fields = [
      row.practice.code,
      row.practice.name,
      row.practice.localityName ?? row.localityCode ?? '',
      row.dataQuality == null ? 'no submission' : String(row.dataQuality),
    ];
    for (const cell of row.cells) {
      if (!cell) fields.push('', '', '', 'no submission');
      else
        fields.push(
          String(cell.n),
          String(cell.events),
          cell.rate == null ? '' : cell.rate.toFixed(4),
          flagShortText(cell.exact),
        );
    }
    lines.push(fields.map(csvField).join(','));
  }
  return lines.join('\r\n') + '\r\n';
}
