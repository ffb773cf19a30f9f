/**
 * Fixed bins of the value histograms a practice's drill-down plots (common practice: equal-width
 * bins over the plausible range of each measurement, docs/methods.md §7, with edges on the
 * treatment-target thresholds of docs/methods.md §3–4 so that a chart can shade them exactly).
 * Each histogram counts, per type group, the eligible records by their latest value in the
 * review window: [not recorded, below `from`, bin 0 … bin `bins` − 1, at or above the last edge].
 * Bin k holds from + k·width ≤ value < from + (k + 1)·width. The eGFR histogram's "not
 * recorded" counts the records whose eGFR cannot be computed (the kidney grid says why).
 *
 * The bins are part of the sums' layout and fingerprint (sums-layout.ts): changing them makes
 * stored sums unreadable until they are recomputed, by design.
 */
export type ValueHistogramKey = 'hba1c' | 'systolic' | 'diastolic' | 'cholesterol' | 'bmi' | 'egfr';

export interface ValueHistogramSpec {
  key: ValueHistogramKey;
  label: string;
  unit: string;
  /** Lower edge of the first bin, bin width and number of bins. */
  from: number;
  width: number;
  bins: number;
}

export const VALUE_HISTOGRAMS: readonly ValueHistogramSpec[] = [
  // Edges at 48, 53, 58 and 75 mmol/mol.
  { key: 'hba1c', label: 'HbA1c', unit: 'mmol/mol', from: 20, width: 1, bins: 130 },
  // Edges at 130, 140 and 150 mmHg.
  { key: 'systolic', label: 'Systolic blood pressure', unit: 'mmHg', from: 70, width: 2, bins: 90 },
  // Edges at 80 and 90 mmHg.
  {
    key: 'diastolic',
    label: 'Diastolic blood pressure',
    unit: 'mmHg',
    from: 30,
    width: 2,
    bins: 65,
  },
  // Edge at 5.0 mmol/L.
  { key: 'cholesterol', label: 'Total cholesterol', unit: 'mmol/L', from: 1, width: 0.2, bins: 55 },
  { key: 'bmi', label: 'BMI', unit: 'kg/m²', from: 12, width: 1, bins: 53 },
  // Edges at the KDIGO 2012 GFR categories 15, 30, 45, 60 and 90.
  {
    key: 'egfr',
    label: 'eGFR (CKD-EPI 2021)',
    unit: 'mL/min/1.73 m²',
    from: 0,
    width: 5,
    bins: 30,
  },
];

/** Slots of one histogram: not recorded, below, the bins, at or above. */
export function histogramSlots(spec: ValueHistogramSpec): number {
  return spec.bins + 3;
}

/**
 * The slot of a recorded value: 1 below the first edge, 2 + k for bin k, bins + 2 at or above
 * the last edge. A tolerance of 1e-9 bins lets a decimal value that lies on an edge (5.0
 * mmol/L, held as the nearest binary number) fall in the bin that the edge opens.
 */
export function valueSlot(spec: ValueHistogramSpec, value: number): number {
  const k = Math.floor((value - spec.from) / spec.width + 1e-9);
  if (k < 0) return 1;
  if (k >= spec.bins) return spec.bins + 2;
  return k + 2;
}

/** The lower edge of each bin and the upper edge of the last, for plotting. */
export function binEdges(spec: ValueHistogramSpec): number[] {
  const edges: number[] = [];
  for (let k = 0; k <= spec.bins; k++)
    edges.push(Math.round((spec.from + k * spec.width) * 1e9) / 1e9);
  return edges;
}
