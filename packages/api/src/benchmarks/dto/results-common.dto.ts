/**
 * Pieces every results response shares: what a result was built from, an
 * interval, a funnel flag in words, case mix, over-dispersion, run-chart
 * signals, data-quality counts. Each is a class with every field described
 * (the OpenAPI document and the web's generated types).
 */
import { ApiProperty } from '@nestjs/swagger';
import { TYPE_SPLITS, type TypeSplit } from '@cairn/metrics';
import { IsIn, IsOptional } from 'class-validator';
import { ApiPropertyOptional } from '@nestjs/swagger';

export const FUNNEL_BANDS = ['within', 'notable', 'outlier'] as const;
export type FunnelBandName = (typeof FUNNEL_BANDS)[number];
export const FUNNEL_SIDES = ['above', 'below'] as const;
export type FunnelSideName = (typeof FUNNEL_SIDES)[number];
export const FLAG_ASSESSMENTS = ['better', 'worse'] as const;
export type FlagAssessmentName = (typeof FLAG_ASSESSMENTS)[number];

export class SplitQueryDto {
  @ApiPropertyOptional({
    enum: TYPE_SPLITS,
    enumName: 'TypeSplit',
    default: 'all',
    description: 'Diabetes types: all; type 1; type 2 and other',
  })
  @IsOptional()
  @IsIn(TYPE_SPLITS)
  split?: TypeSplit;
}

export class BuiltFromDto {
  @ApiProperty({ type: Number, description: 'The stored result (benchmark_results)' })
  resultId!: number;

  @ApiProperty({ type: Number }) quarterId!: number;

  @ApiProperty({ type: String, example: '2026 Q3' }) quarterLabel!: string;

  @ApiProperty({ type: String, example: 'cairn-default-2026.1' }) measureSetId!: string;

  @ApiProperty({ type: Number, description: 'Current submissions it was built from' })
  submissions!: number;

  @ApiProperty({
    type: String,
    description:
      'SHA-256 (hex) of the sorted ids of those submissions: results with the same key were built from the same set',
  })
  submissionsKey!: string;

  @ApiProperty({ type: String, description: 'When it was built (ISO 8601)' })
  builtAt!: string;

  @ApiProperty({ type: Number, description: 'Milliseconds the build took' })
  buildMs!: number;
}

export class IntervalDto {
  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'null when there is nothing to estimate',
  })
  lower!: number | null;

  @ApiProperty({ type: Number, nullable: true })
  upper!: number | null;
}

export class FlagDto {
  @ApiProperty({
    enum: FUNNEL_BANDS,
    enumName: 'FunnelBand',
    nullable: true,
    description:
      'within the 95 % limits; notable: beyond them; outlier: beyond the 99.8 % limits. null when n = 0',
  })
  band!: FunnelBandName | null;

  @ApiProperty({
    enum: FUNNEL_SIDES,
    enumName: 'FunnelSide',
    nullable: true,
    description: 'Which side of the limits the rate lies beyond; null when within',
  })
  side!: FunnelSideName | null;

  @ApiProperty({
    enum: FLAG_ASSESSMENTS,
    enumName: 'FlagAssessment',
    nullable: true,
    description: 'The side read through the measure’s direction: better or worse than expected',
  })
  assessment!: FlagAssessmentName | null;
}

export class FlagWithLimitsDto extends FlagDto {
  @ApiProperty({ type: IntervalDto, description: 'The 95 % limits at this n' })
  inner!: IntervalDto;

  @ApiProperty({ type: IntervalDto, description: 'The 99.8 % limits at this n' })
  outer!: IntervalDto;
}

export class CaseMixDto {
  @ApiProperty({ type: Number, description: 'O: events observed' }) observed!: number;

  @ApiProperty({
    type: Number,
    description: 'E: events expected from the region’s stratum rates (indirect standardisation)',
  })
  expected!: number;

  @ApiProperty({ type: Number, nullable: true, description: 'O/E; null when E = 0' })
  ratio!: number | null;

  @ApiProperty({ type: IntervalDto, description: 'Exact (Garwood) 95 % interval of O/E' })
  interval!: IntervalDto;

  @ApiProperty({ type: Number, nullable: true, description: '(O/E) × the region’s rate' })
  adjustedRate!: number | null;
}

export class OverdispersionDto {
  @ApiProperty({ type: Number, nullable: true, description: 'φ: mean of the Winsorised z²' })
  phi!: number | null;

  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'τ²: the additive between-unit variance',
  })
  tau2!: number | null;

  @ApiProperty({ type: Boolean, description: 'I·φ above the χ²(I − 1) 95 % point' })
  present!: boolean;

  @ApiProperty({ type: Number, nullable: true, description: 'I·φ' })
  statistic!: number | null;

  @ApiProperty({ type: Number, nullable: true, description: 'The χ²(I − 1) 95 % point' })
  critical!: number | null;
}

export class RecordCountsDto {
  @ApiProperty({ type: Number }) total!: number;
  @ApiProperty({ type: Number, description: 'Known diabetes type and old enough' })
  eligible!: number;
  @ApiProperty({ type: Number, description: 'Left out: diabetes type not known' })
  unknownType!: number;
  @ApiProperty({ type: Number, description: 'Left out: under the youngest age counted' })
  underAge!: number;
}

export class DataQualityCountDto {
  @ApiProperty({ type: String, example: 'type1_not_on_insulin' }) code!: string;
  @ApiProperty({ type: String, example: 'Type 1 diabetes but not on insulin' }) title!: string;
  @ApiProperty({ type: Number, description: 'Records of the submission it flagged' })
  count!: number;
}

export class LocalityDto {
  @ApiProperty({ type: String, example: 'HRN' }) code!: string;
  @ApiProperty({ type: String, example: 'Harnleigh Fold' }) name!: string;
}

export const SHIFT_SIDES = ['above', 'below'] as const;
export const TREND_DIRECTIONS = ['up', 'down'] as const;

export class RunShiftDto {
  @ApiProperty({ type: Number, description: 'Index of the first point (into points)' })
  start!: number;
  @ApiProperty({ type: Number, description: 'Index of the last point' }) end!: number;
  @ApiProperty({ type: Number, description: 'Points in the shift' }) length!: number;
  @ApiProperty({ enum: SHIFT_SIDES, enumName: 'ShiftSide' }) side!: 'above' | 'below';
}

export class RunTrendDto {
  @ApiProperty({ type: Number, description: 'Index of the first point (into points)' })
  start!: number;
  @ApiProperty({ type: Number, description: 'Index of the last point' }) end!: number;
  @ApiProperty({ type: Number }) length!: number;
  @ApiProperty({ enum: TREND_DIRECTIONS, enumName: 'TrendDirection' }) direction!: 'up' | 'down';
}

export class RunsLimitsDto {
  @ApiProperty({ type: Number }) lower!: number;
  @ApiProperty({ type: Number }) upper!: number;
}

export class RunChartSignalsDto {
  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'The centre line (median of the rates)',
  })
  median!: number | null;
  @ApiProperty({ type: Number, description: 'Points neither missing nor on the median' })
  usefulObservations!: number;
  @ApiProperty({ type: Number }) runs!: number;
  @ApiProperty({
    type: RunsLimitsDto,
    nullable: true,
    description: 'Fewest and most runs expected by chance; null under 10 useful points',
  })
  runsLimits!: RunsLimitsDto | null;
  @ApiProperty({ type: Boolean }) tooFewRuns!: boolean;
  @ApiProperty({ type: Boolean }) tooManyRuns!: boolean;
  @ApiProperty({ type: [RunShiftDto], description: '6 or more points on one side of the median' })
  shifts!: RunShiftDto[];
  @ApiProperty({ type: [RunTrendDto], description: '5 or more points all going up or all down' })
  trends!: RunTrendDto[];
}

export const TREND_POINT_STATES = ['value', 'no-submission', 'not-in-measure-set'] as const;
export type TrendPointState = (typeof TREND_POINT_STATES)[number];

export class TrendPointDto {
  @ApiProperty({
    enum: TREND_POINT_STATES,
    enumName: 'TrendPointState',
    description:
      'value: figures below; no-submission: no current submission that quarter (a gap); not-in-measure-set: that quarter’s measure set has no such measure (a gap)',
  })
  state!: TrendPointState;
  @ApiProperty({ type: Number }) events!: number;
  @ApiProperty({ type: Number }) n!: number;
  @ApiProperty({ type: Number, nullable: true, description: 'null for a gap or n = 0' })
  rate!: number | null;
}

/** A quarter of a series; points[i] of every trend in the same response is quarters[i]. */
export class SeriesQuarterDto {
  @ApiProperty({ type: Number }) quarterId!: number;
  @ApiProperty({ type: String, example: '2026 Q2' }) quarterLabel!: string;
  @ApiProperty({ type: String, description: 'The measure set of that quarter' })
  measureSetId!: string;
  @ApiProperty({
    type: BuiltFromDto,
    nullable: true,
    description: 'What that quarter’s figures were built from; null: no current submission then',
  })
  builtFrom!: BuiltFromDto | null;
}

export class RateTrendDto {
  @ApiProperty({
    type: [TrendPointDto],
    description: 'Oldest quarter first: points[i] is the response’s quarters[i]',
  })
  points!: TrendPointDto[];
  @ApiProperty({ type: RunChartSignalsDto }) signals!: RunChartSignalsDto;
}
