/** The audit quarter as the API sends it (alone, in lists, and inside submissions and coverage). */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  IsDateString,
  IsIn,
  IsInt,
  IsOptional,
  IsString,
  Matches,
  Max,
  Min,
} from 'class-validator';

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
  @IsDateString({ strict: true })
  submissionDeadline?: string;

  @ApiPropertyOptional({ type: String, example: 'cairn-default-2026.1' })
  @IsOptional()
  @IsString()
  @Matches(/^[a-z0-9][a-z0-9.-]{0,63}$/)
  measureSetId?: string;
}
