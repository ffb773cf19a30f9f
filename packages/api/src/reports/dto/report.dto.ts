/** Published reports as the API sends them, and the inputs that publish and withdraw one. */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsInt, IsOptional, IsString, Matches, MaxLength, Min } from 'class-validator';
import {
  BenchmarkTrendDto,
  MeasureFunnelDto,
  RegionBenchmarkDto,
} from '../../benchmarks/dto/benchmark.dto.js';
import { PracticeResultsWithDetailDto } from '../../benchmarks/dto/practice-results.dto.js';
import { PracticeDto } from '../../organisations/dto/practice.dto.js';

export const REPORT_STATUSES = ['published', 'replaced', 'withdrawn'] as const;
export type ReportStatus = (typeof REPORT_STATUSES)[number];

export const DISCLOSURE_SUPPRESSIONS = ['none', 'primary', 'secondary'] as const;

export class PublishReportDto {
  @ApiProperty({
    type: String,
    minLength: 1,
    maxLength: 2000,
    example: 'Second quarter of the new foot-surveillance measure; OV303 had not submitted.',
    description: 'What readers should know about this report (kept with it for good)',
  })
  @IsString()
  @Matches(/\S/, { message: 'releaseNote must not be blank' })
  @MaxLength(2000, { message: 'releaseNote must be at most 2,000 characters' })
  releaseNote!: string;
}

export class WithdrawReportDto {
  @ApiProperty({
    type: String,
    minLength: 1,
    maxLength: 2000,
    example: 'A practice’s extract was found to hold another quarter’s records.',
  })
  @IsString()
  @Matches(/\S/, { message: 'reason must not be blank' })
  @MaxLength(2000, { message: 'reason must be at most 2,000 characters' })
  reason!: string;
}

export class ReportListQueryDto {
  @ApiPropertyOptional({ type: Number, description: 'Only the reports of this audit quarter' })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  quarterId?: number;
}

export class ReportRefDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ type: String, example: '2026 Q3 · report 2' }) label!: string;
}

export class ReportWithdrawalDto {
  @ApiProperty({ type: String, description: 'ISO 8601' }) at!: string;
  @ApiProperty({ type: String, example: 'Imogen Varley' }) by!: string;
  @ApiProperty({ type: String }) reason!: string;
}

export class ReportActionsDto {
  @ApiProperty({ type: Boolean, description: 'The reader may withdraw this report' })
  withdraw!: boolean;
  @ApiProperty({
    type: Boolean,
    description: 'The reader may read the region’s figures, data pack and PDF',
  })
  region!: boolean;
}

/** A published report's identity and standing (without its figures). */
export class ReportDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ type: String, example: '2026 Q3 · report 1' }) label!: string;
  @ApiProperty({ type: Number, description: 'The how-manieth report of its quarter (1, 2, …)' })
  sequence!: number;
  @ApiProperty({ type: Number }) quarterId!: number;
  @ApiProperty({ type: String, example: '2026 Q3' }) quarterLabel!: string;
  @ApiProperty({ type: String, example: 'cairn-default-2026.1' }) measureSetId!: string;
  @ApiProperty({ enum: REPORT_STATUSES, enumName: 'ReportStatus' }) status!: ReportStatus;
  @ApiProperty({ type: String, description: 'ISO 8601' }) publishedAt!: string;
  @ApiProperty({ type: String, example: 'Imogen Varley' }) publishedBy!: string;
  @ApiProperty({ type: String }) releaseNote!: string;
  @ApiProperty({
    type: String,
    example: '3f1c…',
    description: 'SHA-256 (hex) of the report’s canonical bytes',
  })
  contentHash!: string;
  @ApiProperty({ type: Number, description: 'Submissions the figures were computed from' })
  submissionCount!: number;
  @ApiProperty({ type: ReportRefDto, nullable: true, description: 'The report that replaced it' })
  replacedBy!: ReportRefDto | null;
  @ApiProperty({ type: ReportWithdrawalDto, nullable: true })
  withdrawal!: ReportWithdrawalDto | null;
  @ApiProperty({ type: String, example: '/reports/12', description: 'The report’s permanent page' })
  permalink!: string;
  @ApiProperty({
    type: [PracticeDto],
    description:
      'The practices whose part the reader may open: every practice of the report for regional leads and auditors, their own for practice leads',
  })
  practices!: PracticeDto[];
  @ApiProperty({ type: ReportActionsDto }) actions!: ReportActionsDto;
}

export class ReportListActionsDto {
  @ApiProperty({
    type: Boolean,
    description: 'The reader may publish a report of the quarter asked for (false without one)',
  })
  publish!: boolean;
}

export class ReportListDto {
  @ApiProperty({ type: [ReportDto], description: 'Newest first' }) reports!: ReportDto[];
  @ApiProperty({ type: ReportListActionsDto }) actions!: ReportListActionsDto;
}

/** A count as a table under disclosure control shows it. */
export class DisclosedCellDto {
  @ApiProperty({ type: Number, nullable: true, description: 'null when suppressed' })
  value!: number | null;
  @ApiProperty({ type: String, example: '< 5' }) display!: string;
  @ApiProperty({ enum: DISCLOSURE_SUPPRESSIONS, enumName: 'DisclosureSuppression' })
  suppression!: (typeof DISCLOSURE_SUPPRESSIONS)[number];
}

export class PeerRowDto {
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ type: Boolean, description: 'The reader’s own practice (shown in full)' })
  own!: boolean;
  @ApiProperty({ type: DisclosedCellDto, description: 'People who met the measure' })
  met!: DisclosedCellDto;
  @ApiProperty({ type: DisclosedCellDto, description: 'People who did not' })
  notMet!: DisclosedCellDto;
  @ApiProperty({ type: DisclosedCellDto, description: 'The denominator (met + not met)' })
  n!: DisclosedCellDto;
  @ApiProperty({ type: Number, nullable: true, description: 'met / n; null when withheld' })
  rate!: number | null;
}

/**
 * One measure's practices × (met, not met) table with row and column totals, under two-way
 * disclosure control: no suppressed count can be worked out from what is shown.
 */
export class PeerTableDto {
  @ApiProperty({ type: String, example: 'hba1c_target' }) measure!: string;
  @ApiProperty({ type: String, example: 'all' }) split!: string;
  @ApiProperty({ type: [PeerRowDto] }) rows!: PeerRowDto[];
  @ApiProperty({ type: DisclosedCellDto }) met!: DisclosedCellDto;
  @ApiProperty({ type: DisclosedCellDto }) notMet!: DisclosedCellDto;
  @ApiProperty({ type: DisclosedCellDto }) n!: DisclosedCellDto;
  @ApiProperty({ type: Number, nullable: true }) rate!: number | null;
  @ApiProperty({
    type: Boolean,
    description: 'No suppression pattern could protect every count: the table is withheld',
  })
  withheld!: boolean;
}

/** The region's part of a report (regional leads and auditors). */
export class ReportRegionDto {
  @ApiProperty({ type: ReportDto }) report!: ReportDto;
  @ApiProperty({
    type: [RegionBenchmarkDto],
    description: 'Every practice on every measure: everyone, type 1, type 2 and other',
  })
  splits!: RegionBenchmarkDto[];
  @ApiProperty({ type: [MeasureFunnelDto], description: 'Each measure’s funnel (everyone)' })
  funnels!: MeasureFunnelDto[];
  @ApiProperty({
    type: [BenchmarkTrendDto],
    description: 'Each measure over the quarters up to this one',
  })
  trends!: BenchmarkTrendDto[];
  @ApiProperty({
    type: [PeerTableDto],
    description: 'Each measure’s table under disclosure control, as handed beyond the practices',
  })
  peerTables!: PeerTableDto[];
  @ApiProperty({ type: String }) caution!: string;
}

export const REPORT_PRACTICE_STATES = ['results', 'not-in-report'] as const;

/** One practice's part of a report. */
export class ReportPracticeDto {
  @ApiProperty({ type: ReportDto }) report!: ReportDto;
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ enum: REPORT_PRACTICE_STATES, enumName: 'ReportPracticeState' })
  state!: (typeof REPORT_PRACTICE_STATES)[number];
  @ApiProperty({ type: String, nullable: true, description: 'Why there are no results' })
  message!: string | null;
  @ApiProperty({
    type: PracticeResultsWithDetailDto,
    nullable: true,
    description:
      'As frozen: in full for the region’s readers, under disclosure control for practice leads',
  })
  results!: PracticeResultsWithDetailDto | null;
  @ApiProperty({
    type: [PeerTableDto],
    description:
      'Each measure: this practice in full, every other practice under disclosure control',
  })
  peers!: PeerTableDto[];
  @ApiProperty({ type: String }) caution!: string;
}
