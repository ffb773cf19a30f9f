/**
 * The DuckDB side of the benchmark: the same synthetic records loaded into an in-memory DuckDB
 * table (through data chunks), and one GROUP BY query computing, per practice and type group,
 * each care process done, all done, each target met, and the denominators.
 */
import {
  DOUBLE,
  DuckDBDataChunk,
  type DuckDBConnection,
  DuckDBInstance,
  INTEGER,
  SMALLINT,
  UTINYINT,
  type DuckDBType,
  type DuckDBValue,
} from '@duckdb/node-api';
import { type CareColumns, MISSING_MONTH, MISSING_YEAR } from '../src/index.js';

const MONTH_COLUMNS = [
  ['hba1c_month', 'hba1c'],
  ['bp_month', 'bloodPressure'],
  ['chol_month', 'cholesterol'],
  ['creat_month', 'serumCreatinine'],
  ['acr_month', 'urineAlbumin'],
  ['foot_month', 'footSurveillance'],
  ['bmi_month', 'bmi'],
  ['smoking_month', 'smoking'],
  ['retinal_month', 'retinalScreening'],
] as const;

const VALUE_COLUMNS = [
  ['hba1c', 'hba1c'],
  ['systolic', 'systolic'],
  ['diastolic', 'diastolic'],
  ['chol', 'cholesterol'],
] as const;

export async function openDuckDb(): Promise<{
  instance: DuckDBInstance;
  connection: DuckDBConnection;
}> {
  const instance = await DuckDBInstance.create(':memory:', { threads: '2' });
  const connection = await instance.connect();
  return { instance, connection };
}

/** Loads the columns the query needs into table `records` (NULL for not recorded). */
export async function loadIntoDuckDb(
  connection: DuckDBConnection,
  columns: CareColumns,
): Promise<void> {
  await connection.run('DROP TABLE IF EXISTS records');
  const defs = [
    'practice INTEGER',
    'birth_year SMALLINT',
    'dtype UTINYINT', // NULL unknown, 1 type 1, 2 type 2, 3 other
    ...MONTH_COLUMNS.map(([name]) => `${name} SMALLINT`),
    ...VALUE_COLUMNS.map(([name]) => `${name} DOUBLE`),
    'on_statin UTINYINT', // NULL unknown, 1 no, 2 yes
  ];
  await connection.run(`CREATE TABLE records (${defs.join(', ')})`);
  const types: DuckDBType[] = [
    INTEGER,
    SMALLINT,
    UTINYINT,
    ...MONTH_COLUMNS.map(() => SMALLINT),
    ...VALUE_COLUMNS.map(() => DOUBLE),
    UTINYINT,
  ];
  const appender = await connection.createAppender('records');
  const CHUNK = 2048;
  const chunk = DuckDBDataChunk.create(types, CHUNK);
  const N = columns.length;
  for (let start = 0; start < N; start += CHUNK) {
    const len = Math.min(CHUNK, N - start);
    const end = start + len;
    const cols: DuckDBValue[][] = [];
    cols.push(Array.from(columns.practice.subarray(start, end)));
    cols.push(Array.from(columns.birthYear.subarray(start, end)));
    cols.push(Array.from(columns.diabetesType.subarray(start, end), (t) => (t === 0 ? null : t)));
    for (const [, field] of MONTH_COLUMNS) {
      cols.push(
        Array.from(columns.months[field].subarray(start, end), (m) =>
          m === MISSING_MONTH ? null : m,
        ),
      );
    }
    for (const [, field] of VALUE_COLUMNS) {
      cols.push(
        Array.from(columns.values[field].subarray(start, end), (v) => (Number.isNaN(v) ? null : v)),
      );
    }
    cols.push(Array.from(columns.onStatin.subarray(start, end), (f) => (f === 0 ? null : f)));
    chunk.reset();
    chunk.rowCount = len;
    chunk.setColumns(cols);
    appender.appendDataChunk(chunk);
  }
  appender.flushSync();
  appender.closeSync();
  void MISSING_YEAR;
}

/** The comparison query: one row per practice and type group (0 type 1, 1 type 2 and other). */
export function comparisonSql(window: {
  startIndex: number;
  endIndex: number;
  endYear: number;
  retinalStartIndex: number;
}): string {
  const lo = window.startIndex;
  const hi = window.endIndex;
  const inW = (column: string): string => `(${column} BETWEEN ${lo} AND ${hi})`;
  const age = `(${window.endYear} - birth_year)`;
  const processes = MONTH_COLUMNS.map(([name]) =>
    name === 'retinal_month'
      ? `(${name} BETWEEN ${window.retinalStartIndex} AND ${hi})`
      : inW(name),
  );
  const bpTarget = `(${inW('bp_month')} AND ((${age} < 80 AND systolic < 140 AND diastolic < 90) OR (${age} >= 80 AND systolic < 150 AND diastolic < 90)))`;
  const lipid = `(on_statin = 2 OR (${inW('chol_month')} AND chol < 5))`;
  const hba1c53 = `(${inW('hba1c_month')} AND hba1c <= 53)`;
  const select = [
    'practice',
    'CASE WHEN dtype = 1 THEN 0 ELSE 1 END AS tg',
    'count(*) AS eligible',
    ...processes.map((p, i) => `count_if(${p}) AS p${i}`),
    `count_if(${processes.join(' AND ')}) AS all_processes`,
    `count_if(${inW('hba1c_month')} AND hba1c <= 48) AS hba1c_le_48`,
    `count_if(${hba1c53}) AS hba1c_le_53`,
    `count_if(${inW('hba1c_month')} AND hba1c <= 58) AS hba1c_le_58`,
    `count_if(${inW('hba1c_month')} AND hba1c > 75) AS hba1c_gt_75`,
    `count_if(${inW('hba1c_month')}) AS hba1c_measured`,
    `count_if(${bpTarget}) AS bp_target`,
    `count_if(${inW('bp_month')} AND systolic < 130 AND diastolic < 80) AS bp_130_80`,
    `count_if(${inW('bp_month')}) AS bp_measured`,
    `count_if(${inW('chol_month')} AND chol < 5) AS cholesterol_lt_5`,
    `count_if(${inW('chol_month')}) AS chol_measured`,
    `count_if(${age} BETWEEN 40 AND 75 AND on_statin = 2) AS statin_40_75`,
    `count_if(${age} BETWEEN 40 AND 75) AS statin_denominator`,
    `count_if(${age} BETWEEN 40 AND 75 AND on_statin IS NOT NULL) AS statin_measured`,
    `count_if(${lipid}) AS lipid_managed`,
    `count_if(${hba1c53} AND ${bpTarget} AND ${lipid}) AS targets_composite`,
  ];
  return `SELECT ${select.join(',\n  ')}
FROM records
WHERE dtype IS NOT NULL AND ${age} >= 12
GROUP BY practice, tg
ORDER BY practice, tg`;
}

/** Runs the query and returns its rows as arrays of numbers. */
export async function runComparison(
  connection: DuckDBConnection,
  sql: string,
): Promise<number[][]> {
  const reader = await connection.runAndReadAll(sql);
  return reader.getRows().map((row) => row.map((v) => Number(v)));
}
