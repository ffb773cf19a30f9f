/**
 * One practice's results for an audit quarter: every measure and split with
 * its own figures, the region's rate, median and limits at its n, its flags,
 * change and trend, improvement potential and data-quality flags
 * (PracticeResultsDto); and, on their own route, its detail against the
 * region: the breakdowns, the kidney grid, time to insulin and value
 * histograms (PracticeResultsDetailDto). Other practices appear only as region
 * aggregates or as unnamed points; for a practice lead both are under
 * disclosure control (docs/methods.md §9).
 */
import { ApiProperty } from '@nestjs/swagger';
import { TYPE_SPLITS, type TypeSplit } from '@cairn/metrics';
import { BreakdownDto, MeasureDto } from '../../measure-sets/dto/measure-set.dto.js';
import { PracticeDto } from '../../organisations/dto/practice.dto.js';
import { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import {
  BuiltFromDto,
  CaseMixDto,
  DataQualityCountDto,
  FlagWithLimitsDto,
  IntervalDto,
  RateTrendDto,
  RecordCountsDto,
  SeriesQuarterDto,
} from './results-common.dto.js';

export const PRACTICE_RESULTS_STATES = ['results', 'no-current-submission'] as const;
export type PracticeResultsState = (typeof PRACTICE_RESULTS_STATES)[number];

export const PEER_DISCLOSURES = ['applied', 'none'] as const;
export type PeerDisclosure = (typeof PEER_DISCLOSURES)[number];

/** A count as shown beyond the practice: the value, or null with "< 5" / "withheld". */
export class DisclosedCountDto {
  @ApiProperty({ type: Number, nullable: true, description: 'null when suppressed' })
  value!: number | null;
  @ApiProperty({
    type: String,
    example: '< 5',
    description: 'The count as printed: the number, “< 5” or “withheld”',
  })
  display!: string;
}

export class PracticeSubmissionRefDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ type: Number, description: 'Records it holds' }) records!: number;
  @ApiProperty({ type: String, description: 'ISO 8601' }) confirmedAt!: string;
}

export class ResultsActionsDto {
  @ApiProperty({
    type: Boolean,
    description: 'Whether the reader may upload an extract for this practice and quarter',
  })
  upload!: boolean;
  @ApiProperty({ type: String, nullable: true, example: '/extracts/upload?practice=12&quarter=8' })
  uploadPath!: string | null;
}

export class OwnFiguresDto {
  @ApiProperty({ type: Number }) n!: number;
  @ApiProperty({ type: Number }) events!: number;
  @ApiProperty({ type: Number, nullable: true }) rate!: number | null;
  @ApiProperty({ type: IntervalDto, description: 'Wilson 95 % interval' }) interval!: IntervalDto;
  @ApiProperty({
    type: FlagWithLimitsDto,
    description: 'The exact funnel limits at its n and its flag',
  })
  exact!: FlagWithLimitsDto;
  @ApiProperty({
    type: FlagWithLimitsDto,
    description: 'The over-dispersion-adjusted limits at its n and its flag',
  })
  adjusted!: FlagWithLimitsDto;
  @ApiProperty({ type: CaseMixDto }) caseMix!: CaseMixDto;
}

export class RegionFiguresDto {
  @ApiProperty({ type: Number, nullable: true, description: 'θ₀: the region’s pooled rate' })
  rate!: number | null;
  @ApiProperty({ type: Number, nullable: true, description: 'Median of the practices’ rates' })
  median!: number | null;
  @ApiProperty({ type: DisclosedCountDto }) events!: DisclosedCountDto;
  @ApiProperty({ type: DisclosedCountDto }) n!: DisclosedCountDto;
  @ApiProperty({ type: Number, description: 'Practices with n > 0' }) practices!: number;
  @ApiProperty({
    type: Boolean,
    description: 'Over-dispersion present (the adjusted limits are wider)',
  })
  overdispersion!: boolean;
}

export class ChangeDto {
  @ApiProperty({ type: Number }) previousQuarterId!: number;
  @ApiProperty({ type: String }) previousQuarterLabel!: string;
  @ApiProperty({ type: Number }) previousRate!: number;
  @ApiProperty({
    type: Number,
    description: 'This quarter’s rate minus the previous (a proportion)',
  })
  difference!: number;
}

export class ImprovementDto {
  @ApiProperty({
    type: Number,
    nullable: true,
    description:
      'k: records that would need this done (higher is better) or no longer counted (lower is better) to bring the practice to the region median; 0 at or beyond it; null when n = 0',
  })
  records!: number | null;
  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'The region median it is measured against',
  })
  median!: number | null;
}

export class PeerPointsDto {
  @ApiProperty({ type: [Number], description: 'n of each other practice shown, ascending' })
  n!: number[];
  @ApiProperty({ type: [Number], description: 'Its rate (same order)' })
  rate!: number[];
  @ApiProperty({
    type: Number,
    description:
      'Other practices not shown: n under 10 or 1–4 events (disclosure control), or n = 0',
  })
  withheld!: number;
}

export class PracticeSplitResultDto {
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({ type: OwnFiguresDto }) own!: OwnFiguresDto;
  @ApiProperty({ type: RegionFiguresDto }) region!: RegionFiguresDto;
  @ApiProperty({
    type: ChangeDto,
    nullable: true,
    description: 'null when the previous quarter has no rate to compare',
  })
  change!: ChangeDto | null;
  @ApiProperty({ type: ImprovementDto }) improvement!: ImprovementDto;
  @ApiProperty({
    type: RateTrendDto,
    description: 'Every quarter of the region up to this one, with run-chart signals',
  })
  trend!: RateTrendDto;
  @ApiProperty({
    type: RateTrendDto,
    description: 'The region’s pooled rate over the same quarters',
  })
  regionTrend!: RateTrendDto;
  @ApiProperty({ type: PeerPointsDto, description: 'The other practices as unnamed points' })
  peers!: PeerPointsDto;
}

export class PracticeMeasureResultDto {
  @ApiProperty({ type: MeasureDto }) measure!: MeasureDto;
  @ApiProperty({ type: [PracticeSplitResultDto], description: 'all; type 1; type 2 and other' })
  splits!: PracticeSplitResultDto[];
}

// ── the practice's detail against the region ──

export class DetailOwnCountsDto {
  @ApiProperty({ type: Number }) events!: number;
  @ApiProperty({ type: Number }) n!: number;
  @ApiProperty({ type: Number, nullable: true }) rate!: number | null;
  @ApiProperty({ type: IntervalDto, description: 'Wilson 95 % interval' }) interval!: IntervalDto;
}

export class DetailRegionCountsDto {
  @ApiProperty({ type: DisclosedCountDto }) events!: DisclosedCountDto;
  @ApiProperty({ type: DisclosedCountDto }) n!: DisclosedCountDto;
  @ApiProperty({ type: Number, nullable: true, description: 'null when n = 0 or withheld' })
  rate!: number | null;
}

export class DetailCellDto {
  @ApiProperty({ type: String, description: 'Category key (“everyone” for the whole split)' })
  category!: string;
  @ApiProperty({ type: DetailOwnCountsDto }) practice!: DetailOwnCountsDto;
  @ApiProperty({ type: DetailRegionCountsDto, description: 'The region, this practice included' })
  region!: DetailRegionCountsDto;
}

export class DetailBreakdownDto {
  @ApiProperty({ type: String, example: 'age_band' }) breakdown!: string;
  @ApiProperty({ type: [DetailCellDto], description: 'One per category, in the breakdown’s order' })
  cells!: DetailCellDto[];
}

export class DetailSplitDto {
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({ type: DetailCellDto }) everyone!: DetailCellDto;
  @ApiProperty({ type: [DetailBreakdownDto] }) breakdowns!: DetailBreakdownDto[];
}

export class DetailMeasureDto {
  @ApiProperty({ type: String }) measure!: string;
  @ApiProperty({ type: [DetailSplitDto] }) splits!: DetailSplitDto[];
}

export class KidneyRowDto {
  @ApiProperty({ type: String, example: 'G3a', description: 'A row of `rows`' }) row!: string;
  @ApiProperty({ type: [Number], description: 'The practice’s count per albuminuria column' })
  practice!: number[];
  @ApiProperty({
    type: [DisclosedCountDto],
    description: 'The region’s count per column, this practice included, as shown',
  })
  region!: DisclosedCountDto[];
}

export class KidneySplitDto {
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({ type: [KidneyRowDto], description: 'One per GFR row, in `rows` order' })
  rows!: KidneyRowDto[];
}

export class KidneyGridDto {
  @ApiProperty({
    type: [String],
    description: 'GFR categories (KDIGO 2012) and why eGFR is unknown',
  })
  rows!: string[];
  @ApiProperty({ type: [String], description: 'Albuminuria categories (KDIGO 2012) and no ACR' })
  columns!: string[];
  @ApiProperty({ type: [KidneySplitDto] }) splits!: KidneySplitDto[];
}

export class SurvivalStepDto {
  @ApiProperty({ type: Number, description: 'Whole years since diagnosis' }) time!: number;
  @ApiProperty({ type: DisclosedCountDto }) atRisk!: DisclosedCountDto;
  @ApiProperty({ type: DisclosedCountDto }) events!: DisclosedCountDto;
  @ApiProperty({ type: Number, nullable: true, description: 'S(t); null when withheld' })
  survival!: number | null;
  @ApiProperty({ type: Number, nullable: true, description: 'Greenwood standard error' })
  standardError!: number | null;
}

export class SurvivalDto {
  @ApiProperty({ type: DisclosedCountDto, description: 'People with type 2 in the estimate' })
  n!: DisclosedCountDto;
  @ApiProperty({ type: DisclosedCountDto, description: 'Insulin starts' })
  events!: DisclosedCountDto;
  @ApiProperty({
    type: Number,
    description: 'Left out for incomplete or inconsistent insulin data',
  })
  excluded!: number;
  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'Median years to insulin; null when survival stays above ½',
  })
  median!: number | null;
  @ApiProperty({ type: [SurvivalStepDto], description: 'Kaplan–Meier steps' })
  steps!: SurvivalStepDto[];
}

export class ProgressionDto {
  @ApiProperty({ type: SurvivalDto }) practice!: SurvivalDto;
  @ApiProperty({ type: SurvivalDto, description: 'The region, this practice included' })
  region!: SurvivalDto;
  @ApiProperty({
    type: Number,
    description:
      'A rule of thumb of the field for type 2 (years from diagnosis to insulin), for reference only',
  })
  ruleOfThumbYears!: number;
}

export class HistogramCountsDto {
  @ApiProperty({ type: DisclosedCountDto }) notRecorded!: DisclosedCountDto;
  @ApiProperty({ type: DisclosedCountDto, description: 'Below the first edge' })
  below!: DisclosedCountDto;
  @ApiProperty({ type: [DisclosedCountDto], description: 'Bin i: edges[i] ≤ value < edges[i + 1]' })
  bins!: DisclosedCountDto[];
  @ApiProperty({ type: DisclosedCountDto, description: 'At or above the last edge' })
  above!: DisclosedCountDto;
}

export class HistogramSplitDto {
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({ type: HistogramCountsDto }) practice!: HistogramCountsDto;
  @ApiProperty({ type: HistogramCountsDto }) region!: HistogramCountsDto;
}

export class ValueHistogramDto {
  @ApiProperty({ type: String, example: 'hba1c' }) key!: string;
  @ApiProperty({ type: String, example: 'HbA1c' }) label!: string;
  @ApiProperty({ type: String, example: 'mmol/mol' }) unit!: string;
  @ApiProperty({ type: [Number] }) edges!: number[];
  @ApiProperty({ type: [HistogramSplitDto] }) splits!: HistogramSplitDto[];
}

export class PracticeDetailDto {
  @ApiProperty({ type: [BreakdownDto], description: 'The breakdowns and their categories' })
  breakdowns!: BreakdownDto[];
  @ApiProperty({
    type: [DetailMeasureDto],
    description: 'Per measure and split, by breakdown category',
  })
  measures!: DetailMeasureDto[];
  @ApiProperty({ type: KidneyGridDto }) kidney!: KidneyGridDto;
  @ApiProperty({ type: ProgressionDto, description: 'Type 2: time from diagnosis to insulin' })
  progression!: ProgressionDto;
  @ApiProperty({ type: [ValueHistogramDto] }) values!: ValueHistogramDto[];
}

export class PracticeResultsDto {
  @ApiProperty({
    enum: PRACTICE_RESULTS_STATES,
    enumName: 'PracticeResultsState',
    description: 'no-current-submission: the practice has no confirmed extract for the quarter',
  })
  state!: PracticeResultsState;
  @ApiProperty({ type: String, nullable: true, description: 'What the state means, in words' })
  message!: string | null;
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ type: QuarterDto }) quarter!: QuarterDto;
  @ApiProperty({ type: String }) measureSetId!: string;
  @ApiProperty({ type: PracticeSubmissionRefDto, nullable: true })
  submission!: PracticeSubmissionRefDto | null;
  @ApiProperty({ type: BuiltFromDto, nullable: true }) builtFrom!: BuiltFromDto | null;
  @ApiProperty({ type: ResultsActionsDto }) actions!: ResultsActionsDto;
  @ApiProperty({
    enum: PEER_DISCLOSURES,
    enumName: 'PeerDisclosure',
    description:
      'applied: region figures and peers are under disclosure control (counts 1–4 as “< 5”, rates of fewer than 10 withheld); none: the reader may see every practice',
  })
  disclosure!: PeerDisclosure;
  @ApiProperty({ type: RecordCountsDto, nullable: true }) records!: RecordCountsDto | null;
  @ApiProperty({
    type: [SeriesQuarterDto],
    description:
      'Every quarter of the region up to this one, oldest first: the quarters of every trend below',
  })
  quarters!: SeriesQuarterDto[];
  @ApiProperty({
    type: [PracticeMeasureResultDto],
    description: 'Care processes first, then treatment targets',
  })
  measures!: PracticeMeasureResultDto[];
  @ApiProperty({
    type: [DataQualityCountDto],
    description: 'Clinical data-quality flags of its current submission',
  })
  dataQuality!: DataQualityCountDto[];
  @ApiProperty({ type: String }) caution!: string;
}

/** The practice's detail against the region for an audit quarter (its own route). */
export class PracticeResultsDetailDto {
  @ApiProperty({
    enum: PRACTICE_RESULTS_STATES,
    enumName: 'PracticeResultsState',
    description:
      'no-current-submission: the practice has no confirmed extract for the quarter, so no detail',
  })
  state!: PracticeResultsState;
  @ApiProperty({ type: PracticeDto, description: 'The practice the detail is of' })
  practice!: PracticeDto;
  @ApiProperty({ type: QuarterDto, description: 'The audit quarter the detail is of' })
  quarter!: QuarterDto;
  @ApiProperty({
    type: BuiltFromDto,
    nullable: true,
    description:
      'The stored result the detail was built from: the same resultId as the results it goes with; null without a current submission',
  })
  builtFrom!: BuiltFromDto | null;
  @ApiProperty({
    enum: PEER_DISCLOSURES,
    enumName: 'PeerDisclosure',
    description:
      'applied: the region’s counts are under disclosure control (counts 1–4 as “< 5”, rates of fewer than 10 withheld); none: shown in full',
  })
  disclosure!: PeerDisclosure;
  @ApiProperty({
    type: PracticeDetailDto,
    nullable: true,
    description:
      'Breakdowns, kidney grid, time to insulin and value histograms, the practice against the region; null without a current submission or without the sums to build it from',
  })
  detail!: PracticeDetailDto | null;
  @ApiProperty({ type: String, description: 'The clinical caution to show with these figures' })
  caution!: string;
}

/**
 * A practice's results with their detail, as a published report freezes them: both built from
 * the same stored result (PracticeResultsService.resultsWithDetail).
 */
export class PracticeResultsWithDetailDto extends PracticeResultsDto {
  @ApiProperty({
    type: PracticeDetailDto,
    nullable: true,
    description:
      'Breakdowns, kidney grid, time to insulin and value histograms, the practice against the region',
  })
  detail!: PracticeDetailDto | null;
}
