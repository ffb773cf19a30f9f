/** The audit quarter as the API sends it (alone, in lists, and inside submissions and coverage). */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  buildMessage,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  Matches,
  Max,
  Min,
  isISO8601,
  ValidateBy,
} from 'class-validator';

/** A calendar date written YYYY-MM-DD (no time), that exists (no 30 February). */
function IsCalendarDate(): PropertyDecorator {
  return ValidateBy({
    name: 'isCalendarDate',
    validator: {
      validate: (value: unknown) =>
        typeof value === 'string' &&
        /^\d{4}-\d{2}-\d{2}$/.test(value) &&
        isISO8601(value, { strict: true }),
      defaultMessage: buildMessage(() => '$property must be a date written YYYY-MM-DD'),
    },
  });
}

export const QUARTER_STATUSES = ['open', 'closed'] as const;
export type QuarterStatus = (typeof QUARTER_STATUSES)[number];

export class QuarterDto {
  @ApiProperty({ type: Number })
  id!: number;

  @ApiProperty({ type: Number })
  regionId!: number;

  @ApiProperty({ type: Number, example: 2026 })
  year!: number;

  @ApiProperty({ type: Number, enum: [1, 2, 3, 4], example: 3 })
  quarter!: 1 | 2 | 3 | 4;

  @ApiProperty({ type: String, example: '2026 Q3' })
  label!: string;

  @ApiProperty({
    type: String,
    example: '2025-10',
    description: 'First month of the review window',
  })
  windowStart!: string;

  @ApiProperty({ type: String, example: '2026-09', description: 'Last month of the review window' })
  windowEnd!: string;

  @ApiProperty({ type: String, example: 'cairn-default-2026.1' })
  measureSetId!: string;

  @ApiProperty({ type: String, example: '2026-12-16' })
  submissionDeadline!: string;

  @ApiProperty({
    enum: QUARTER_STATUSES,
    enumName: 'QuarterStatus',
    description: 'Closed: closed to practice uploads (a regional lead can still correct it)',
  })
  status!: QuarterStatus;

  @ApiProperty({ type: String, description: 'ISO 8601' })
  openedAt!: string;

  @ApiProperty({ nullable: true, type: String, description: 'ISO 8601' })
  closedAt!: string | null;
}

export class OpenQuarterDto {
  @ApiProperty({ type: Number, example: 2026 })
  @IsInt()
  @Min(2000)
  @Max(2100)
  year!: number;

  @ApiProperty({ type: Number, enum: [1, 2, 3, 4], example: 4 })
  @IsInt()
  @IsIn([1, 2, 3, 4])
  quarter!: number;

  @ApiPropertyOptional({
    type: String,
    example: '2027-03-18',
    description: 'Default: a fixed number of days after the quarter ends',
  })
  @IsOptional()
  @IsCalendarDate()
  submissionDeadline?: string;

  @ApiPropertyOptional({ type: String, example: 'cairn-default-2026.1' })
  @IsOptional()
  @IsString()
  @Matches(/^[a-z0-9][a-z0-9.-]{0,63}$/)
  measureSetId?: string;
}

/** Changes to a quarter: its deadline, and (while it is open, before any report) its measure set. */
export class UpdateQuarterDto {
  @ApiPropertyOptional({ type: String, example: '2027-02-14', description: 'YYYY-MM-DD' })
  @IsOptional()
  @IsCalendarDate()
  submissionDeadline?: string;

  @ApiPropertyOptional({ type: String, example: 'cairn-default-2026.2' })
  @IsOptional()
  @IsString()
  @Matches(/^[a-z0-9][a-z0-9.-]{0,63}$/, { message: '$property must be a measure-set id' })
  measureSetId?: string;
}

export class ReopenQuarterDto {
  @ApiPropertyOptional({
    type: String,
    example: '2027-02-14',
    description: 'A new deadline (YYYY-MM-DD); the current one is kept when not given',
  })
  @IsOptional()
  @IsCalendarDate()
  submissionDeadline?: string;
}

/** What the caller may do with a quarter (decided by quarter-policy.ts). */
export class QuarterActionsDto {
  @ApiProperty({ type: Boolean }) close!: boolean;
  @ApiProperty({ type: Boolean }) reopen!: boolean;
  @ApiProperty({ type: Boolean }) changeDeadline!: boolean;

  @ApiProperty({
    type: Boolean,
    description: 'Only while the quarter is open and no report has been published from it',
  })
  changeMeasureSet!: boolean;
}

/** A report published from a quarter. */
export class QuarterReportDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ type: String }) label!: string;
  @ApiProperty({ type: String, example: 'published' }) status!: string;
  @ApiProperty({ type: String, description: 'ISO 8601' }) publishedAt!: string;
}
