/** The outlier list and the drill-down of one practice × measure. */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { TYPE_SPLITS, type TypeSplit } from '@cairn/metrics';
import { Transform, Type } from 'class-transformer';
import { IsBoolean, IsIn, IsInt, IsOptional, IsString, Max, MaxLength, Min } from 'class-validator';
import { PracticeDto } from '../../organisations/dto/practice.dto.js';
import { BreakdownDto, MeasureDto } from '../../measure-sets/dto/measure-set.dto.js';
import { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import {
  ChangeDto,
  DetailBreakdownDto,
  DetailCellDto,
  ImprovementDto,
  OwnFiguresDto,
  RegionFiguresDto,
  ValueHistogramDto,
} from '../../benchmarks/dto/practice-results.dto.js';
import {
  DataQualityCountDto,
  LocalityDto,
  RateTrendDto,
  SplitQueryDto,
} from '../../benchmarks/dto/results-common.dto.js';
import { CaseEvidenceDto, EVIDENCE_ORIGINS } from './review-case.dto.js';
import { CASE_STATUSES, type CaseStatus } from '../review-case-policy.js';

export const OUTLIER_LEVELS = ['outer', 'inner'] as const;
export const ASSESSMENTS = ['worse', 'better'] as const;

const toBoolean = ({ value }: { value: unknown }) =>
  value === 'true' ? true : value === 'false' ? false : value;

export class OutlierQueryDto {
  @ApiPropertyOptional({
    enum: OUTLIER_LEVELS,
    enumName: 'OutlierLevel',
    default: 'outer',
    description: 'outer: beyond the 99.8 % limits; inner: beyond the 95 % limits too',
  })
  @IsOptional()
  @IsIn(OUTLIER_LEVELS)
  level?: (typeof OUTLIER_LEVELS)[number];

  @ApiPropertyOptional({
    type: Boolean,
    default: false,
    description: 'Judge the case-mix adjusted rate',
  })
  @IsOptional()
  @Transform(toBoolean)
  @IsBoolean()
  caseMix?: boolean;

  @ApiPropertyOptional({ enum: TYPE_SPLITS, enumName: 'TypeSplit', default: 'all' })
  @IsOptional()
  @IsIn(TYPE_SPLITS)
  split?: TypeSplit;

  @ApiPropertyOptional({ type: String, description: 'Only this measure (its key)' })
  @IsOptional()
  @IsString()
  @MaxLength(64)
  measure?: string;

  @ApiPropertyOptional({
    enum: ASSESSMENTS,
    enumName: 'OutlierAssessment',
    description: 'worse or better than expected',
  })
  @IsOptional()
  @IsIn(ASSESSMENTS)
  assessment?: (typeof ASSESSMENTS)[number];

  @ApiPropertyOptional({ type: String, description: 'Only this locality (its code)' })
  @IsOptional()
  @IsString()
  @MaxLength(32)
  locality?: string;
}

export class OutlierBasisDto {
  @ApiProperty({ enum: EVIDENCE_ORIGINS, enumName: 'EvidenceOrigin' })
  origin!: 'draft' | 'report';
  @ApiProperty({ type: Number }) resultId!: number;
  @ApiProperty({ type: String }) key!: string;
  @ApiProperty({ type: String }) measureSetId!: string;
  @ApiProperty({ type: String }) builtAt!: string;
}

export class OpenCaseRefDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ enum: CASE_STATUSES, enumName: 'CaseStatus' }) status!: CaseStatus;
}

export class OutlierMeasureDto {
  @ApiProperty({ type: String }) key!: string;
  @ApiProperty({ type: String }) label!: string;
  @ApiProperty({ type: String, enum: ['higher', 'lower'] }) direction!: string;
  @ApiProperty({ type: String, description: 'The guideline behind it' }) source!: string;
}

export class OutlierRowDto {
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ type: String, nullable: true }) localityCode!: string | null;
  @ApiProperty({ type: OutlierMeasureDto }) measure!: OutlierMeasureDto;
  @ApiProperty({ type: String, enum: ['notable', 'outlier'] }) band!: 'notable' | 'outlier';
  @ApiProperty({ type: String, enum: ['above', 'below'] }) side!: 'above' | 'below';
  @ApiProperty({ enum: ASSESSMENTS, enumName: 'OutlierAssessment' })
  assessment!: 'worse' | 'better';
  @ApiProperty({ type: Number, description: 'The rate judged (crude or case-mix adjusted)' })
  rate!: number;
  @ApiProperty({ type: Number, description: 'The limit it lies beyond' }) limit!: number;
  @ApiProperty({ type: Number, description: 'Strength of evidence: z under the limits used' })
  z!: number;
  @ApiProperty({ type: CaseEvidenceDto }) evidence!: CaseEvidenceDto;
  @ApiProperty({
    type: Number,
    description: 'Consecutive quarters flagged on this side, this one included',
  })
  flaggedQuarters!: number;
  @ApiProperty({ type: OpenCaseRefDto, nullable: true, description: 'A case not yet closed' })
  openCase!: OpenCaseRefDto | null;
}

export class OutlierListDto {
  @ApiProperty({ type: String, enum: ['results', 'no-accepted-submissions'] })
  state!: 'results' | 'no-accepted-submissions';
  @ApiProperty({ type: QuarterDto }) quarter!: QuarterDto;
  @ApiProperty({ type: OutlierBasisDto, nullable: true }) basis!: OutlierBasisDto | null;
  @ApiProperty({ enum: OUTLIER_LEVELS, enumName: 'OutlierLevel' }) level!: 'outer' | 'inner';
  @ApiProperty({ type: Boolean }) caseMix!: boolean;
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({ type: [OutlierMeasureDto] }) measures!: OutlierMeasureDto[];
  @ApiProperty({ type: [LocalityDto] }) localities!: LocalityDto[];
  @ApiProperty({ type: [OutlierRowDto], description: 'Strongest evidence first' })
  rows!: OutlierRowDto[];
  @ApiProperty({ type: Number, description: 'Practices judged' }) practices!: number;
  @ApiProperty({ type: Boolean, description: 'Whether the reader may open cases' })
  mayOpenCases!: boolean;
  @ApiProperty({ type: String }) caution!: string;
}

export class DrillBreakdownDto {
  @ApiProperty({ type: BreakdownDto }) breakdown!: BreakdownDto;
  @ApiProperty({ type: DetailBreakdownDto }) cells!: DetailBreakdownDto;
}

/** One diabetes type's figures of a drill-down: the practice results page's, without the peers. */
export class DrillSplitDto {
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
}

export class DrillDownDto {
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ type: QuarterDto }) quarter!: QuarterDto;
  @ApiProperty({ type: MeasureDto }) measure!: MeasureDto;
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({ type: OutlierBasisDto }) basis!: OutlierBasisDto;
  @ApiProperty({ type: CaseEvidenceDto, description: 'Its figures and why, in words' })
  evidence!: CaseEvidenceDto;
  @ApiProperty({
    type: [DrillSplitDto],
    description: 'By diabetes type: all, type 1, type 2 and other (trend with run-chart signals)',
  })
  splits!: DrillSplitDto[];
  @ApiProperty({
    type: [String],
    description: 'The quarters of each trend’s points, oldest first',
  })
  trendQuarters!: string[];
  @ApiProperty({ type: DetailCellDto, nullable: true }) everyone!: DetailCellDto | null;
  @ApiProperty({
    type: [DrillBreakdownDto],
    description: 'Age band, sex, deprivation, duration: practice against region per category',
  })
  breakdowns!: DrillBreakdownDto[];
  @ApiProperty({
    type: ValueHistogramDto,
    nullable: true,
    description: 'Values against the region',
  })
  histogram!: ValueHistogramDto | null;
  @ApiProperty({ type: [DataQualityCountDto] }) dataQuality!: DataQualityCountDto[];
  @ApiProperty({
    type: [OpenCaseRefDto],
    description: 'Cases on this practice × measure not closed',
  })
  openCases!: OpenCaseRefDto[];
  @ApiProperty({ type: Boolean }) mayOpenCase!: boolean;
  @ApiProperty({ type: String }) caution!: string;
}

export class DrillRecordDto {
  @ApiProperty({
    type: String,
    description: 'The record’s pseudonym (never the practice’s reference)',
  })
  pseudonym!: string;
  @ApiProperty({ type: Number }) birthYear!: number;
  @ApiProperty({ type: Number, description: 'At the end of the review window' }) age!: number;
  @ApiProperty({ type: String }) sex!: string;
  @ApiProperty({ type: String }) diabetesType!: string;
  @ApiProperty({ type: Number, nullable: true }) deprivationQuintile!: number | null;
  @ApiProperty({ type: String, enum: ['met', 'not_met', 'unknown'] })
  outcome!: 'met' | 'not_met' | 'unknown';
  @ApiProperty({ type: String, description: 'What the measure reads, with months' })
  readings!: string;
}

export class DrillRecordsQueryDto extends SplitQueryDto {
  @ApiPropertyOptional({ type: Number, default: 1 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  page?: number;

  @ApiPropertyOptional({ type: Number, default: 50, maximum: 200 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(200)
  pageSize?: number;
}

export class DrillRecordPageDto {
  @ApiProperty({ type: Number, description: 'Records in the measure’s denominator' })
  total!: number;
  @ApiProperty({ type: Number }) page!: number;
  @ApiProperty({ type: Number }) pageSize!: number;
  @ApiProperty({ type: [DrillRecordDto] }) records!: DrillRecordDto[];
}
