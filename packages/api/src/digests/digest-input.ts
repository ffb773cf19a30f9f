/**
 * Everything a practice's digest says, as plain data: what the composer
 * (digest-compose.ts) is a pure function of. DigestSources fill it from the
 * report a digest belongs to; the composer never reads anything else.
 */

export type FlagBand = 'within' | 'notable' | 'outlier';
export type FlagSide = 'above' | 'below';
export type FlagAssessment = 'better' | 'worse';

export interface DigestMeasure {
  key: string;
  label: string;
  kind: 'care_process' | 'treatment_target';
  direction: 'higher' | 'lower';
  /** The guideline or rule the measure comes from */
  source: string;
  /** People counted (denominator) and those meeting the measure */
  n: number;
  events: number;
  /** Proportion 0–1; null when n = 0 */
  rate: number | null;
  /** Wilson 95 % interval of the rate */
  interval: { lower: number | null; upper: number | null };
  /** Against the region's limits at this n (over-dispersion-adjusted when present) */
  flag: { band: FlagBand | null; side: FlagSide | null; assessment: FlagAssessment | null };
  /** Median of the region's practices' rates; null when withheld or none */
  regionMedian: number | null;
  /** People who would need the measure met (or no longer counted) to reach the median */
  improvement: number | null;
  /** The previous quarter's rate, when there is one to compare */
  previous: { label: string; rate: number } | null;
  /** Run-chart signals that end at this quarter (docs/methods.md, run charts) */
  signals: {
    shift: { side: FlagSide; length: number } | null;
    trend: { direction: 'up' | 'down'; length: number } | null;
  };
}

export interface DigestInput {
  region: { name: string };
  practice: { id: number; code: string; name: string };
  quarter: { id: number; label: string };
  /** What the digest is made from: the report's label and when it was published */
  report: { id: number; label: string; publishedAt: string };
  /** no-current-submission: the practice has no figures in this report */
  state: 'results' | 'no-current-submission';
  /** Care processes first, then treatment targets (the report's order) */
  measures: DigestMeasure[];
  /** Review cases about the practice that wait for its answer */
  openReviewCases: number;
  /** Clinical data-quality flags of its submission (total count) */
  dataQualityFlags: number;
  caution: string;
  /** Links into Cairn: every one asks the reader to sign in; none carries data */
  links: { report: string; recallLists: string; reviewCases: string; profile: string };
}

/** Who the message is addressed to; a person with a user account can change their preferences. */
export interface DigestRecipient {
  name: string | null;
  /** True for a practice lead (a Cairn user), false for an extra address */
  isUser: boolean;
}
