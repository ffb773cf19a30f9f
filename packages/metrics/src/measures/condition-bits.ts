import type { CareColumns } from '../records/columns.js';
import { type ConditionNode, MEASUREMENT_MONTH } from './compile.js';
import type { ReviewWindow } from './quarter.js';

/**
 * The bit evaluators of the interpreted columnar loop: for a block of records, each condition
 * node sets its bits in the records' outcome state by a loop specialised to its rule. State
 * words are laid out word-major, `BLOCK` records per word: a node's slot of 1 bit (met 1) or 2
 * bits (unknown 0, not met 2, met 3) at bit position b lives in word ⌊b/32⌋ of each record.
 */
export const BLOCK = 2048;

/** A node's (or a measure's) slot in the outcome state. */
export interface NodeSlot {
  bit: number;
  width: 1 | 2;
}

/** Sets a node's bits for records start … start + len − 1. */
export function evaluateNode(
  nodes: readonly ConditionNode[],
  n: number,
  slots: readonly NodeSlot[],
  columns: CareColumns,
  w: ReviewWindow,
  start: number,
  len: number,
  ageOf: Int32Array,
  state: Int32Array,
): void {
  const node = nodes[n] as ConditionNode;
  const slot = slots[n] as NodeSlot;
  const o = Math.floor(slot.bit / 32) * BLOCK;
  const sh = slot.bit % 32;
  switch (node.op) {
    case 'recorded': {
      const lo = node.window === 'retinal' ? w.retinalStartIndex : w.startIndex;
      recordedBits(columns.months[node.field], lo, w.endIndex - lo, start, len, state, o, sh);
      return;
    }
    case 'value': {
      const months = columns.months[MEASUREMENT_MONTH[node.measurement]];
      const values = columns.values[node.measurement];
      const span = w.endIndex - w.startIndex;
      valueBits(
        months,
        values,
        node.comparator,
        node.threshold,
        w.startIndex,
        span,
        start,
        len,
        state,
        o,
        sh,
      );
      return;
    }
    case 'bloodPressure':
      bloodPressureBits(columns, node.bands, w, start, len, ageOf, state, o, sh);
      return;
    case 'flag': {
      const yes = node.equals ? 3 : 2;
      const no = node.equals ? 2 : 3;
      flagBits(columns[node.flag], yes, no, start, len, state, o, sh);
      return;
    }
    case 'all':
    case 'any':
      compositeBits(node.op, node.inputs, slots, slot.width, len, state, o, sh);
      return;
  }
}

function recordedBits(
  months: Int16Array,
  lo: number,
  span: number,
  start: number,
  len: number,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  for (let j = 0; j < len; j++) {
    const inside = +(((months[start + j] as number) - lo) >>> 0 <= span);
    state[o + j] = (state[o + j] as number) | (inside << sh);
  }
}

function valueBits(
  months: Int16Array,
  values: Float64Array,
  comparator: 'lt' | 'le' | 'gt' | 'ge',
  t: number,
  lo: number,
  span: number,
  start: number,
  len: number,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  // Two bits: known (in the window) and met; unknown 0, not met 2, met 3.
  const cmp = comparator === 'lt' ? 0 : comparator === 'le' ? 1 : comparator === 'gt' ? 2 : 3;
  for (let j = 0; j < len; j++) {
    const known = +(((months[start + j] as number) - lo) >>> 0 <= span);
    const v = values[start + j] as number;
    const met = cmp === 0 ? +(v < t) : cmp === 1 ? +(v <= t) : cmp === 2 ? +(v > t) : +(v >= t);
    state[o + j] = (state[o + j] as number) | (((known << 1) | (known & met)) << sh);
  }
}

function bloodPressureBits(
  columns: CareColumns,
  bands: readonly { minAge: number; systolicBelow: number; diastolicBelow: number }[],
  w: ReviewWindow,
  start: number,
  len: number,
  ageOf: Int32Array,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  const months = columns.months.bloodPressure;
  const systolic = columns.values.systolic;
  const diastolic = columns.values.diastolic;
  const lo = w.startIndex;
  const span = w.endIndex - w.startIndex;
  const first = bands[0] as (typeof bands)[number];
  const second = bands[1];
  const twoBands = bands.length === 2 && second !== undefined;
  for (let j = 0; j < len; j++) {
    const known = +(((months[start + j] as number) - lo) >>> 0 <= span);
    let band = first;
    if (twoBands) {
      if ((ageOf[j] as number) >= second.minAge) band = second;
    } else {
      for (let b = 1; b < bands.length; b++) {
        const candidate = bands[b] as (typeof bands)[number];
        if ((ageOf[j] as number) >= candidate.minAge) band = candidate;
      }
    }
    const met =
      +((systolic[start + j] as number) < band.systolicBelow) &
      +((diastolic[start + j] as number) < band.diastolicBelow);
    state[o + j] = (state[o + j] as number) | (((known << 1) | (known & met)) << sh);
  }
}

function flagBits(
  flags: Uint8Array,
  yes: number,
  no: number,
  start: number,
  len: number,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  // Flag codes: 0 not recorded, 1 no, 2 yes.
  const lut = new Uint8Array([0, no, yes]);
  for (let j = 0; j < len; j++) {
    const v = lut[flags[start + j] as number] as number;
    state[o + j] = (state[o + j] as number) | (v << sh);
  }
}

function compositeBits(
  op: 'all' | 'any',
  inputs: readonly number[],
  slots: readonly NodeSlot[],
  width: 1 | 2,
  len: number,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  // Per state word: bits of one-bit inputs, met bits and known bits of two-bit inputs.
  const words = new Map<number, { one: number; met: number; known: number }>();
  for (const input of inputs) {
    const s = slots[input] as NodeSlot;
    const word = Math.floor(s.bit / 32);
    const m = words.get(word) ?? { one: 0, met: 0, known: 0 };
    if (s.width === 1) m.one |= 1 << (s.bit % 32);
    else {
      m.met |= 1 << (s.bit % 32);
      m.known |= 1 << ((s.bit % 32) + 1);
    }
    words.set(word, m);
  }
  const list = [...words.entries()];
  const wordOffset = Int32Array.from(list.map(([word]) => word * BLOCK));
  const one = Int32Array.from(list.map(([, m]) => m.one));
  const met = Int32Array.from(list.map(([, m]) => m.met));
  const known = Int32Array.from(list.map(([, m]) => m.known));
  const all = op === 'all';
  for (let j = 0; j < len; j++) {
    let anyNotMet = 0;
    let anyUnknown = 0;
    let anyMet = 0;
    for (let k = 0; k < wordOffset.length; k++) {
      const s = state[(wordOffset[k] as number) + j] as number;
      const oneBits = one[k] as number;
      const metBits = met[k] as number;
      const knownBits = known[k] as number;
      anyNotMet |= (~s & oneBits) | ((s >>> 1) & ~s & metBits);
      anyUnknown |= ~s & knownBits;
      anyMet |= s & (oneBits | metBits);
    }
    let v: number;
    if (all) {
      v = anyNotMet !== 0 ? 2 : anyUnknown !== 0 ? 0 : 3;
    } else {
      v = anyMet !== 0 ? 3 : anyUnknown !== 0 ? 0 : 2;
    }
    // A one-bit composite (inputs never unknown) keeps only the met bit.
    if (width === 1) v &= 1;
    state[o + j] = (state[o + j] as number) | (v << sh);
  }
}
