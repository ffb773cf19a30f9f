import { CARE_PROCESS_FIELDS } from '../records/record.js';
import { MEASUREMENT_FIELDS, MISSING_YEAR } from '../records/columns.js';
import { type CompiledMeasureSet, type ConditionNode, MEASUREMENT_MONTH } from './compile.js';
import { canBeUnknown, type HistogramLayout, isRestricted } from './layout.js';
import type { ReviewWindow } from './quarter.js';

/**
 * The columnar path's record loop, generated for one measure set and review window: one pass
 * over the records in which every condition, population filter, pack cell (layout.ts) and
 * histogram increment is written out with its constants, the way a query engine compiles a
 * query. The source is assembled only from numbers (thresholds, ages, bit strides, offsets)
 * and from names checked against the record model's own field lists; nothing else from the
 * measure set reaches it. `evaluate-columns.ts` falls back to its table-driven loop where
 * generated code is not allowed. Both are property-tested against the plain evaluation.
 *
 * The loop counts only the records not eligible (by reason); record totals come from the
 * practice sizes and eligible counts from the histograms afterwards.
 */
export interface KernelArrays {
  practice: Int32Array;
  birthYear: Int16Array;
  diabetesType: Uint8Array;
  diagnosisYear: Int16Array;
  sex: Uint8Array;
  deprivation: Uint8Array;
  months: Readonly<Record<string, Int16Array>>;
  values: Readonly<Record<string, Float64Array>>;
  flags: Readonly<Record<string, Uint8Array>>;
  ageBandOf: Uint8Array;
  durationBandOf: Uint8Array;
  /** Rollup unit of each practice (its locality, or the region). */
  rollupUnit: Int32Array;
  counts: Uint16Array | Uint32Array;
  rollupCounts: Uint32Array;
  eligible: Uint32Array;
  records: Uint32Array;
  strataCounts: Uint32Array | null;
  cellOf: Uint8Array | null;
  stratumOf: Int32Array | null;
}

export type RecordKernel = (arrays: KernelArrays, start: number, end: number) => void;

export interface KernelShape {
  categories: number;
  ageOffset: number;
  sexOffset: number;
  deprivationOffset: number;
  durationOffset: number;
  ageBands: number;
  durationBands: number;
  maxAge: number;
  /** Practice blocks for every category (true) or only everyone (false; see result.ts). */
  practiceBreakdowns: boolean;
}

const NAME = /^[A-Za-z][A-Za-z0-9]*$/;
const FLAGS = ['onStatin', 'onInsulin', 'cvdHistory'];

function int(n: number): string {
  if (!Number.isSafeInteger(n)) throw new RangeError(`internal: ${n} is not a safe integer`);
  return `(${String(n)})`;
}

function num(n: number): string {
  if (typeof n !== 'number' || !Number.isFinite(n)) {
    throw new RangeError(`internal: ${String(n)} is not a finite number`);
  }
  return `(${String(n)})`;
}

function field(name: string, allowed: readonly string[]): string {
  if (!NAME.test(name) || !allowed.includes(name)) {
    throw new RangeError(`internal: "${name}" is not a record field`);
  }
  return name;
}

const COMPARATORS: Record<string, string> = { lt: '<', le: '<=', gt: '>', ge: '>=' };

/**
 * Node values in the generated code: a one-bit node is 0 (not met) or 1 (met); a node that can
 * be unknown is a digit 0 (unknown), 1 (not met) or 2 (met).
 */
/** The variable holding "field's month is in [lo, end of window]" (0 or 1). */
function windowFlag(column: string, lo: number, w: ReviewWindow): string {
  return `w_${column}_${int(w.endIndex - lo).slice(1, -1)}`;
}

function windowFlags(compiled: CompiledMeasureSet, w: ReviewWindow): string[] {
  const seen = new Map<string, string>();
  const add = (column: string, lo: number): void => {
    const name = windowFlag(column, lo, w);
    if (!seen.has(name)) {
      seen.set(
        name,
        `    const ${name} = +(((${column}[i] - ${int(lo)}) >>> 0) <= ${int(w.endIndex - lo)});`,
      );
    }
  };
  for (const node of compiled.nodes) {
    if (node.op === 'recorded') {
      add(
        `M_${field(node.field, CARE_PROCESS_FIELDS)}`,
        node.window === 'retinal' ? w.retinalStartIndex : w.startIndex,
      );
    } else if (node.op === 'value') {
      add(`M_${field(MEASUREMENT_MONTH[node.measurement], CARE_PROCESS_FIELDS)}`, w.startIndex);
    } else if (node.op === 'bloodPressure') add('M_bloodPressure', w.startIndex);
  }
  return [...seen.values()];
}

function nodeSource(
  nodes: readonly ConditionNode[],
  n: number,
  w: ReviewWindow,
  binary: readonly boolean[],
): string {
  // Written without branches where possible: comparisons become 0 or 1 and combine by
  // arithmetic, which avoids mispredicted jumps on data that is close to random.
  const node = nodes[n] as ConditionNode;
  // In-window flags are computed once per record and field (see kernelSource).
  const inWindow = (column: string, lo: number): string => windowFlag(column, lo, w);
  switch (node.op) {
    case 'recorded': {
      const lo = node.window === 'retinal' ? w.retinalStartIndex : w.startIndex;
      return inWindow(`M_${field(node.field, CARE_PROCESS_FIELDS)}`, lo);
    }
    case 'value': {
      const month = field(MEASUREMENT_MONTH[node.measurement], CARE_PROCESS_FIELDS);
      const value = field(node.measurement, MEASUREMENT_FIELDS);
      const op = COMPARATORS[node.comparator];
      if (op === undefined) throw new RangeError('internal: unknown comparator');
      // known × (1 + met): unknown 0, not met 1, met 2 (a missing value is NaN: not met).
      return `${inWindow(`M_${month}`, w.startIndex)} * (1 + +(v_${value} ${op} ${num(node.threshold)}))`;
    }
    case 'bloodPressure': {
      // Thresholds of the age band: the first band's, plus each later band's step once the
      // age reaches it (bands ascend from age 0).
      const bands = [...node.bands].sort((a, b) => a.minAge - b.minAge);
      const first = bands[0];
      if (first === undefined) throw new RangeError('internal: no bands');
      let systolic = num(first.systolicBelow);
      let diastolic = num(first.diastolicBelow);
      for (let k = 1; k < bands.length; k++) {
        const b = bands[k] as (typeof bands)[number];
        const prev = bands[k - 1] as (typeof bands)[number];
        const step = `+(age >= ${int(b.minAge)})`;
        if (b.systolicBelow !== prev.systolicBelow) {
          systolic += ` + ${step} * ${num(b.systolicBelow - prev.systolicBelow)}`;
        }
        if (b.diastolicBelow !== prev.diastolicBelow) {
          diastolic += ` + ${step} * ${num(b.diastolicBelow - prev.diastolicBelow)}`;
        }
      }
      return `${inWindow('M_bloodPressure', w.startIndex)} * (1 + (+(v_systolic < (${systolic})) & +(v_diastolic < (${diastolic}))))`;
    }
    case 'flag': {
      // Flag codes 0 not recorded, 1 no, 2 yes are already the digits when yes meets it.
      const f = `f_${field(node.flag, FLAGS)}`;
      return node.equals ? `${f}` : `((3 - ${f}) * +(${f} !== 0))`;
    }
    case 'all':
    case 'any': {
      const inputs = node.inputs.map((k) => {
        if (!Number.isInteger(k) || k >= n) throw new RangeError('internal: node order');
        return k;
      });
      if (binary[n])
        return `(${inputs.map((k) => `n${k}`).join(node.op === 'all' ? ' & ' : ' | ')})`;
      // Three-valued, as digits 0 unknown, 1 not met, 2 met (one-bit inputs as 1 + bit).
      const isDigit = (k: number, value: number): string =>
        binary[k] ? (value === 0 ? '0' : `+(n${k} === ${value - 1})`) : `+(n${k} === ${value})`;
      const anyOf = (value: number): string =>
        `(${inputs.map((k) => isDigit(k, value)).join(' | ')})`;
      const unknown = anyOf(0);
      if (node.op === 'all') {
        const notMet = anyOf(1);
        // not met if any input is not met, else unknown if any is unknown, else met.
        return `((nm = ${notMet}) | (((nm ^ 1) & (${unknown} ^ 1)) << 1))`;
      }
      const met = anyOf(2);
      // met if any input is met, else unknown if any is unknown, else not met.
      return `(((mt = ${met}) << 1) | ((mt ^ 1) & (${unknown} ^ 1)))`;
    }
  }
}

function kernelSource(
  compiled: CompiledMeasureSet,
  layout: HistogramLayout,
  w: ReviewWindow,
  shape: KernelShape,
  withStrata: boolean,
): string {
  const nodes = compiled.nodes;
  const binary = nodes.map((_, n) => !canBeUnknown(nodes, n));
  const K = layout.cellsPerBlock;
  const L: string[] = [];
  L.push('"use strict";');
  L.push('return function records(a, start, end) {');
  L.push(
    '  const practice = a.practice, birthYear = a.birthYear, diabetesType = a.diabetesType, diagnosisYear = a.diagnosisYear, sex = a.sex, deprivation = a.deprivation;',
  );
  L.push('  const ageBandOf = a.ageBandOf, durationBandOf = a.durationBandOf;');
  L.push(
    '  const counts = a.counts, rollupCounts = a.rollupCounts, rollupUnit = a.rollupUnit, records = a.records;',
  );
  if (withStrata)
    L.push('  const strataCounts = a.strataCounts, cellOf = a.cellOf, stratumOf = a.stratumOf;');
  for (const f of CARE_PROCESS_FIELDS)
    L.push(`  const M_${field(f, CARE_PROCESS_FIELDS)} = a.months.${f};`);
  for (const f of MEASUREMENT_FIELDS)
    L.push(`  const V_${field(f, MEASUREMENT_FIELDS)} = a.values.${f};`);
  for (const f of FLAGS) L.push(`  const F_${field(f, FLAGS)} = a.flags.${f};`);
  L.push('  let nm = 0, mt = 0;');
  L.push('  for (let i = start; i < end; i++) {');
  L.push('    const p = practice[i];');
  L.push('    const t = diabetesType[i];');
  L.push(`    let age = ${int(w.endYear)} - birthYear[i];`);
  L.push('    const r = p << 2;');
  L.push(
    `    if (t === 0 || age < ${int(compiled.eligibilityMinAge)}) { records[t === 0 ? r + 2 : r + 3]++;${withStrata ? ' stratumOf[i] = -1;' : ''} continue; }`,
  );
  L.push(`    const ab = ageBandOf[age > ${int(shape.maxAge)} ? ${int(shape.maxAge)} : age];`);
  L.push('    const s = sex[i];');
  L.push('    const q = deprivation[i];');
  L.push('    const d = q === 0 ? 5 : q - 1;');
  L.push('    const dy = diagnosisYear[i];');
  L.push(`    const years = ${int(w.endYear)} - dy;`);
  L.push(
    `    const u = dy !== ${int(MISSING_YEAR)} && years >= 0 ? durationBandOf[years > ${int(shape.maxAge)} ? ${int(shape.maxAge)} : years] : ${int(shape.durationBands)};`,
  );
  L.push('    const pg = (p << 1) + (t === 1 ? 0 : 1);');
  L.push(`    const ub = pg * ${int(shape.categories)};`);
  L.push(
    `    const c0 = ub + ${int(shape.ageOffset)} + ab, c1 = ub + ${int(shape.sexOffset)} + s, c2 = ub + ${int(shape.deprivationOffset)} + d, c3 = ub + ${int(shape.durationOffset)} + u;`,
  );
  const C1 = int(shape.categories - 1);
  if (shape.practiceBreakdowns) {
    // Practice blocks for categories 1 … C − 1: ((p·2 + g)·(C − 1) + c − 1).
    L.push(
      `    const b0 = (c0 - pg - 1) * ${int(K)}, b1 = (c1 - pg - 1) * ${int(K)}, b2 = (c2 - pg - 1) * ${int(K)}, b3 = (c3 - pg - 1) * ${int(K)};`,
    );
  } else {
    // One practice block (everyone) per type group; category blocks of the locality or region.
    L.push(`    const pb = pg * ${int(K)};`);
    L.push('    const lg = ((rollupUnit[p] << 1) + (t === 1 ? 0 : 1)) * ' + C1 + ' - 1;');
    L.push(
      `    const b0 = (lg + ${int(shape.ageOffset)} + ab) * ${int(K)}, b1 = (lg + ${int(shape.sexOffset)} + s) * ${int(K)}, b2 = (lg + ${int(shape.deprivationOffset)} + d) * ${int(K)}, b3 = (lg + ${int(shape.durationOffset)} + u) * ${int(K)};`,
    );
  }
  if (withStrata) {
    L.push(
      `    const stratum = ((((t - 1) * ${int(shape.ageBands)} + ab) * 4 + s) * 6 + d) * ${int(shape.durationBands + 1)} + u;`,
    );
    L.push('    stratumOf[i] = stratum;');
    L.push(`    const sb = stratum * ${int(K)};`);
    L.push(`    const ci = i * ${int(layout.packs.length)};`);
  }
  L.push(...windowFlags(compiled, w));
  // Each value and flag a condition reads, loaded once per record.
  const loads = new Set<string>();
  for (const node of nodes) {
    if (node.op === 'value')
      loads.add(
        `    const v_${field(node.measurement, MEASUREMENT_FIELDS)} = V_${node.measurement}[i];`,
      );
    if (node.op === 'bloodPressure') {
      loads.add('    const v_systolic = V_systolic[i];');
      loads.add('    const v_diastolic = V_diastolic[i];');
    }
    if (node.op === 'flag')
      loads.add(`    const f_${field(node.flag, FLAGS)} = F_${node.flag}[i];`);
  }
  L.push(...loads);
  nodes.forEach((_, n) => {
    L.push(`    const n${n} = ${nodeSource(nodes, n, w, binary)};`);
  });
  // Measure digits.
  compiled.measures.forEach((m, k) => {
    const node = compiled.measureNode[k] as number;
    const radix = layout.measureRadix[k];
    let digit: string;
    if (radix === 2) digit = `n${node}`;
    else if (radix === 3) digit = binary[node] ? `(1 + n${node})` : `n${node}`;
    else {
      if (!isRestricted(m)) throw new RangeError('internal: radix 4 for an unrestricted measure');
      const types = m.population.types;
      const mask =
        (types.includes('type1') ? 2 : 0) |
        (types.includes('type2') ? 4 : 0) |
        (types.includes('other') ? 8 : 0);
      const tests = [`((${int(mask)} >> t) & 1) === 1`];
      if (m.population.minAge !== null) tests.push(`age >= ${int(m.population.minAge)}`);
      if (m.population.maxAge !== null) tests.push(`age <= ${int(m.population.maxAge)}`);
      // Digits: unknown 0, excluded 1, not met 2, met 3.
      const inner = binary[node] ? `(2 + n${node})` : `(n${node} + +(n${node} !== 0))`;
      const inside = tests.map((x) => `+(${x})`).join(' & ');
      digit = `(1 + (${inside}) * (${inner} - 1))`;
    }
    L.push(`    const g${k} = ${digit};`);
  });
  L.push('    let x = 0;');
  layout.packs.forEach((pack, p) => {
    const terms = pack.measures.map((m) => {
      const stride = layout.measureStride[m] as number;
      return stride === 1 ? `g${m}` : `g${m} * ${int(stride)}`;
    });
    L.push(`    x = ${terms.join(' + ')};`);
    if (withStrata) L.push(`    cellOf[ci + ${int(p)}] = x;`);
    L.push(`    x += ${int(pack.offset)};`);
    if (shape.practiceBreakdowns) {
      L.push('    counts[b0 + x]++; counts[b1 + x]++; counts[b2 + x]++; counts[b3 + x]++;');
    } else {
      L.push(
        '    counts[pb + x]++; rollupCounts[b0 + x]++; rollupCounts[b1 + x]++; rollupCounts[b2 + x]++; rollupCounts[b3 + x]++;',
      );
    }
    if (withStrata) L.push('    strataCounts[sb + x]++;');
  });
  L.push('  }');
  L.push('};');
  return L.join('\n');
}

// Kernels by source text: the same measure set and window reuse one function, which the engine
// has already optimised, instead of compiling it afresh on every evaluation.
const cache = new Map<string, RecordKernel>();
const CACHE_SIZE = 16;
let allowed = true;

/** The generated record loop, or null where generated code is not allowed. */
export function generatedRecordKernel(
  compiled: CompiledMeasureSet,
  layout: HistogramLayout,
  w: ReviewWindow,
  shape: KernelShape,
  withStrata: boolean,
): RecordKernel | null {
  if (!allowed) return null;
  const source = kernelSource(compiled, layout, w, shape, withStrata);
  const cached = cache.get(source);
  if (cached !== undefined) return cached;
  let kernel: RecordKernel;
  try {
    kernel = (new Function(source) as () => RecordKernel)();
  } catch (error) {
    if (error instanceof SyntaxError) throw error; // a bug in the generator, not a policy
    allowed = false;
    return null;
  }
  if (cache.size >= CACHE_SIZE) cache.delete(cache.keys().next().value as string);
  cache.set(source, kernel);
  return kernel;
}

/**
 * Case mix, pass two, generated: for each eligible record, add its stratum's rate to its
 * practice's expected count of every measure whose denominator it is in, straight-line and
 * without branches (a measure's digit in its pack decides, as a 0/1 factor).
 */
export type ExpectedKernel = (
  stratumOf: Int32Array,
  cellOf: Uint8Array,
  practice: Int32Array,
  diabetesType: Uint8Array,
  rates: Float64Array,
  expected: Float64Array,
) => void;

const expectedCache = new Map<string, ExpectedKernel>();

export function generatedExpectedKernel(
  compiled: CompiledMeasureSet,
  layout: HistogramLayout,
): ExpectedKernel | null {
  if (!allowed) return null;
  const M = compiled.measures.length;
  const PC = layout.packs.length;
  const L: string[] = [];
  L.push('"use strict";');
  L.push(
    'return function expectedCounts(stratumOf, cellOf, practice, diabetesType, rates, expected) {',
  );
  L.push('  const n = stratumOf.length;');
  L.push('  for (let i = 0; i < n; i++) {');
  L.push('    const s = stratumOf[i];');
  L.push('    if (s < 0) continue;');
  L.push(`    const eb = ((practice[i] << 1) + (diabetesType[i] === 1 ? 0 : 1)) * ${int(M)};`);
  L.push(`    const rb = s * ${int(M)};`);
  L.push(`    const ci = i * ${int(PC)};`);
  layout.packs.forEach((pack, p) => {
    L.push(`    const x${p} = cellOf[ci + ${int(p)}];`);
    for (const m of pack.measures) {
      const radix = layout.measureRadix[m] as number;
      const stride = layout.measureStride[m] as number;
      const measured = compiled.measures[m]?.denominator === 'measured';
      // Digits: radix 2 not met 0, met 1; radix 3 unknown 0, not met 1, met 2;
      // radix 4 unknown 0, excluded 1, not met 2, met 3.
      const digit = `((x${p} / ${int(stride)}) | 0) % ${int(radix)}`;
      let factor: string | null;
      if (radix === 2)
        factor = null; // always in the denominator
      else if (radix === 3) factor = measured ? `+((${digit}) >= 1)` : null;
      else factor = measured ? `+((${digit}) >= 2)` : `+((${digit}) !== 1)`;
      const add = factor === null ? `rates[rb + ${int(m)}]` : `rates[rb + ${int(m)}] * ${factor}`;
      L.push(`    expected[eb + ${int(m)}] += ${add};`);
    }
  });
  L.push('  }');
  L.push('};');
  const source = L.join('\n');
  const cached = expectedCache.get(source);
  if (cached !== undefined) return cached;
  let kernel: ExpectedKernel;
  try {
    kernel = (new Function(source) as () => ExpectedKernel)();
  } catch (error) {
    if (error instanceof SyntaxError) throw error;
    allowed = false;
    return null;
  }
  if (expectedCache.size >= CACHE_SIZE)
    expectedCache.delete(expectedCache.keys().next().value as string);
  expectedCache.set(source, kernel);
  return kernel;
}
