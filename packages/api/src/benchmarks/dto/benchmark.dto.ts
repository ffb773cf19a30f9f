/**
 * The region benchmark API (regional leads, auditors): its queries
 * (validated) and everything it sends — every practice on every measure, one
 * measure's funnel, and the region's and every practice's trend.
 */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { TYPE_SPLITS, type TypeSplit } from '@cairn/metrics';
import { Type } from 'class-transformer';
import { IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min } from 'class-validator';
import { MeasureDto } from '../../measure-sets/dto/measure-set.dto.js';
import { PracticeDto } from '../../organisations/dto/practice.dto.js';
import { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import {
  BuiltFromDto,
  CaseMixDto,
  DataQualityCountDto,
  FlagDto,
  FlagWithLimitsDto,
  IntervalDto,
  LocalityDto,
  OverdispersionDto,
  RateTrendDto,
  RecordCountsDto,
  SeriesQuarterDto,
  SplitQueryDto,
} from './results-common.dto.js';

export const BENCHMARK_STATES = ['results', 'no-accepted-submissions'] as const;
export type BenchmarkState = (typeof BENCHMARK_STATES)[number];

// ── queries ──

/** Practices per page of the region benchmark, unless the reader asks for another size. */
export const BENCHMARK_PAGE_SIZE = 100;
export const BENCHMARK_PAGE_MAX = 1000;

export class BenchmarkQueryDto extends SplitQueryDto {
  @ApiPropertyOptional({
    type: String,
    example: 'HRN',
    description: 'Only the practices of this locality (the region’s statistics stay the region’s)',
  })
  @IsOptional()
  @IsString()
  @MaxLength(32)
  @Matches(/^[A-Za-z0-9_-]+$/, {
    message: 'locality must be a locality code (letters, digits, - or _)',
  })
  locality?: string;

  @ApiPropertyOptional({
    type: Number,
    default: 1,
    minimum: 1,
    description: 'Which page of the practices (by code); the region’s figures come with every page',
  })
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'page must be a whole number from 1' })
  @Min(1, { message: 'page must be a whole number from 1' })
  @Max(100_000, { message: 'page must be at most 100000' })
  page?: number;

  @ApiPropertyOptional({
    type: Number,
    default: BENCHMARK_PAGE_SIZE,
    minimum: 1,
    maximum: BENCHMARK_PAGE_MAX,
    description: 'Practices per page',
  })
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: `pageSize must be a whole number from 1 to ${BENCHMARK_PAGE_MAX}` })
  @Min(1, { message: `pageSize must be a whole number from 1 to ${BENCHMARK_PAGE_MAX}` })
  @Max(BENCHMARK_PAGE_MAX, {
    message: `pageSize must be a whole number from 1 to ${BENCHMARK_PAGE_MAX}`,
  })
  pageSize?: number;
}

export class TrendQueryDto extends SplitQueryDto {
  @ApiProperty({
    type: String,
    example: 'hba1c',
    description: 'Key of a measure of the quarter’s measure set',
  })
  @IsString()
  @MaxLength(64)
  measure!: string;
}

// ── the region benchmark ──

export class BenchmarkCellDto {
  @ApiProperty({ type: String, example: 'hba1c' }) measure!: string;
  @ApiProperty({
    type: Number,
    description: 'The denominator: eligible or measured, as the measure declares',
  })
  n!: number;
  @ApiProperty({ type: Number }) events!: number;
  @ApiProperty({ type: Number, nullable: true, description: 'events / n; null when n = 0' })
  rate!: number | null;
  @ApiProperty({ type: IntervalDto, description: 'Wilson 95 % interval of the rate' })
  interval!: IntervalDto;
  @ApiProperty({ type: FlagDto, description: 'Against the exact binomial funnel limits' })
  exact!: FlagDto;
  @ApiProperty({ type: FlagDto, description: 'Against the over-dispersion-adjusted limits' })
  adjusted!: FlagDto;
  @ApiProperty({ type: CaseMixDto }) caseMix!: CaseMixDto;
  @ApiProperty({
    type: Number,
    nullable: true,
    description:
      'Records to change to reach the region’s median rate (0 at or beyond it); null when n = 0',
  })
  improvementPotential!: number | null;
}

export class BenchmarkPracticeDto {
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ type: String, nullable: true, example: 'HRN' }) localityCode!: string | null;
  @ApiProperty({ type: Number, description: 'The current submission its figures come from' })
  submissionId!: number;
  @ApiProperty({ type: RecordCountsDto }) records!: RecordCountsDto;
  @ApiProperty({
    type: [DataQualityCountDto],
    description: 'Clinical data-quality flags of its submission (every check, 0 included)',
  })
  dataQuality!: DataQualityCountDto[];
  @ApiProperty({ type: [BenchmarkCellDto], description: 'One per measure, in `measures` order' })
  cells!: BenchmarkCellDto[];
}

export class RegionMeasureDto {
  @ApiProperty({ type: String, example: 'hba1c' }) measure!: string;
  @ApiProperty({ type: Number, description: 'Σ events over every practice' }) events!: number;
  @ApiProperty({ type: Number, description: 'Σ n over every practice' }) n!: number;
  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'θ₀: the pooled regional rate Σ events / Σ n, the funnel’s target',
  })
  theta0!: number | null;
  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'Median of the practices’ rates (n > 0)',
  })
  median!: number | null;
  @ApiProperty({ type: Number, description: 'Practices with n > 0' }) practices!: number;
  @ApiProperty({
    type: OverdispersionDto,
    nullable: true,
    description: 'null when θ₀ is 0, 1 or unknown',
  })
  overdispersion!: OverdispersionDto | null;
}

export class BenchmarkCoverageDto {
  @ApiProperty({
    type: Number,
    description: 'Active practices of the region (of the locality when filtered)',
  })
  practices!: number;
  @ApiProperty({ type: Number, description: 'Practices with a current submission for the quarter' })
  withSubmission!: number;
  @ApiProperty({
    type: [PracticeDto],
    description: 'Active practices without a current submission: missing, never counted as zero',
  })
  missing!: PracticeDto[];
}

export class BenchmarkPageDto {
  @ApiProperty({ type: Number, description: 'This page, from 1' }) page!: number;
  @ApiProperty({ type: Number, description: 'Practices per page' }) pageSize!: number;
  @ApiProperty({ type: Number, description: 'Pages in all (at least 1)' }) pages!: number;
  @ApiProperty({
    type: Number,
    description: 'Practices with a current submission in all pages (of the locality when filtered)',
  })
  total!: number;
}

export class RegionBenchmarkDto {
  @ApiProperty({
    enum: BENCHMARK_STATES,
    enumName: 'BenchmarkState',
    description: 'no-accepted-submissions: nobody has a current submission for the quarter yet',
  })
  state!: BenchmarkState;
  @ApiProperty({ type: QuarterDto }) quarter!: QuarterDto;
  @ApiProperty({ type: String, example: 'cairn-default-2026.1' }) measureSetId!: string;
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({ type: LocalityDto, nullable: true, description: 'The locality filter, if any' })
  locality!: LocalityDto | null;
  @ApiProperty({ type: [LocalityDto], description: 'The region’s localities (for a filter)' })
  localities!: LocalityDto[];
  @ApiProperty({ type: BuiltFromDto, nullable: true, description: 'null when there is no result' })
  builtFrom!: BuiltFromDto | null;
  @ApiProperty({ type: [MeasureDto], description: 'Care processes first, then treatment targets' })
  measures!: MeasureDto[];
  @ApiProperty({ type: [RegionMeasureDto], description: 'One per measure, in `measures` order' })
  region!: RegionMeasureDto[];
  @ApiProperty({
    type: [BenchmarkPracticeDto],
    description: 'Practices with a current submission, by code: this page of them',
  })
  practices!: BenchmarkPracticeDto[];
  @ApiProperty({ type: BenchmarkPageDto, description: 'Which page of the practices this is' })
  page!: BenchmarkPageDto;
  @ApiProperty({ type: BenchmarkCoverageDto }) coverage!: BenchmarkCoverageDto;
  @ApiProperty({ type: String, description: 'The clinical caution to show with these figures' })
  caution!: string;
}

// ── one measure's funnel ──

export class FunnelPointDto {
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ type: String, nullable: true }) localityCode!: string | null;
  @ApiProperty({ type: Number }) n!: number;
  @ApiProperty({ type: Number }) events!: number;
  @ApiProperty({ type: Number, nullable: true }) rate!: number | null;
  @ApiProperty({ type: IntervalDto, description: 'Wilson 95 % interval' }) interval!: IntervalDto;
  @ApiProperty({ type: Number, nullable: true, description: '(rate − θ₀) / √(θ₀(1 − θ₀)/n)' })
  z!: number | null;
  @ApiProperty({
    type: FlagWithLimitsDto,
    description: 'Exact binomial limits at its n, and its flag',
  })
  exact!: FlagWithLimitsDto;
  @ApiProperty({
    type: FlagWithLimitsDto,
    description: 'Over-dispersion-adjusted limits at its n, and its flag',
  })
  adjusted!: FlagWithLimitsDto;
  @ApiProperty({ type: CaseMixDto }) caseMix!: CaseMixDto;
  @ApiProperty({ type: Number, nullable: true }) improvementPotential!: number | null;
}

export class FunnelLimitCurvesDto {
  @ApiProperty({ type: [Number], description: '95 % lower limit at each n of the grid' })
  innerLower!: number[];
  @ApiProperty({ type: [Number] }) innerUpper!: number[];
  @ApiProperty({ type: [Number], description: '99.8 % lower limit at each n of the grid' })
  outerLower!: number[];
  @ApiProperty({ type: [Number] }) outerUpper!: number[];
}

export class FunnelCurvesDto {
  @ApiProperty({ type: [Number], description: 'The grid of n the curves are drawn at' })
  n!: number[];
  @ApiProperty({ type: FunnelLimitCurvesDto, description: 'Exact binomial limits' })
  exact!: FunnelLimitCurvesDto;
  @ApiProperty({
    type: FunnelLimitCurvesDto,
    nullable: true,
    description: 'Over-dispersion-adjusted limits; null when no over-dispersion is present',
  })
  adjusted!: FunnelLimitCurvesDto | null;
}

export class FunnelOverdispersionDto extends OverdispersionDto {
  @ApiProperty({
    type: IntervalDto,
    nullable: true,
    description: 'The z-scores’ 10th and 90th percentiles the Winsorising clips to',
  })
  bounds!: IntervalDto | null;
}

export class MeasureFunnelDto {
  @ApiProperty({ enum: BENCHMARK_STATES, enumName: 'BenchmarkState' }) state!: BenchmarkState;
  @ApiProperty({ type: QuarterDto }) quarter!: QuarterDto;
  @ApiProperty({ type: String }) measureSetId!: string;
  @ApiProperty({ type: BuiltFromDto, nullable: true }) builtFrom!: BuiltFromDto | null;
  @ApiProperty({ type: MeasureDto }) measure!: MeasureDto;
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({
    type: RegionMeasureDto,
    nullable: true,
    description: 'null when there is no result',
  })
  region!: RegionMeasureDto | null;
  @ApiProperty({
    type: FunnelOverdispersionDto,
    nullable: true,
    description: 'φ, τ², whether present, the χ² statistic and its critical value',
  })
  overdispersion!: FunnelOverdispersionDto | null;
  @ApiProperty({ type: [FunnelPointDto], description: 'Every practice with a current submission' })
  points!: FunnelPointDto[];
  @ApiProperty({
    type: FunnelCurvesDto,
    nullable: true,
    description: 'null when θ₀ is 0, 1 or unknown',
  })
  curves!: FunnelCurvesDto | null;
  @ApiProperty({
    type: [PracticeDto],
    description: 'Active practices without a current submission',
  })
  missing!: PracticeDto[];
  @ApiProperty({ type: String }) caution!: string;
}

// ── trend ──

export class TrendQuarterDto extends SeriesQuarterDto {
  @ApiProperty({ type: Boolean, description: 'Whether that quarter’s measure set has the measure' })
  hasMeasure!: boolean;
}

export class PracticeTrendDto {
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ type: RateTrendDto }) trend!: RateTrendDto;
}

export class BenchmarkTrendDto {
  @ApiProperty({ type: QuarterDto, description: 'The latest quarter of the series' })
  quarter!: QuarterDto;
  @ApiProperty({ type: MeasureDto }) measure!: MeasureDto;
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({
    type: [TrendQuarterDto],
    description: 'Every quarter of the region up to this one, oldest first',
  })
  quarters!: TrendQuarterDto[];
  @ApiProperty({ type: RateTrendDto, description: 'The region’s pooled rate per quarter' })
  region!: RateTrendDto;
  @ApiProperty({ type: [PracticeTrendDto], description: 'Every practice of the region, by code' })
  practices!: PracticeTrendDto[];
}
