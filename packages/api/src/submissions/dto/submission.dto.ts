/** DTOs of the submissions API (validation of inputs; the OpenAPI document). */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsOptional, IsString, MaxLength, Min } from 'class-validator';
import { SUBMISSION_STATUSES } from '../submission-store.js';

export class UploadQueryDto {
  @ApiPropertyOptional({
    enum: ['day_first', 'month_first'],
    description:
      'How text dates such as 04/05/2026 are written in the file; without it such dates are refused as ambiguous',
  })
  @IsOptional()
  @IsIn(['day_first', 'month_first'])
  dateConvention?: 'day_first' | 'month_first';
}

export class IssueQueryDto {
  @ApiPropertyOptional({ default: 0 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(0)
  offset?: number;

  @ApiPropertyOptional({ default: 200, maximum: 2000 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  limit?: number;

  @ApiPropertyOptional({ enum: ['error', 'warning', 'flag'] })
  @IsOptional()
  @IsIn(['error', 'warning', 'flag'])
  severity?: string;

  @ApiPropertyOptional({ example: 'out_of_range' })
  @IsOptional()
  @IsString()
  @MaxLength(48)
  code?: string;

  @ApiPropertyOptional({ example: 'hba1c_value', description: 'The heading as given in the file' })
  @IsOptional()
  @IsString()
  @MaxLength(128)
  column?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  row?: number;

  @ApiPropertyOptional({
    enum: ['row', '-row', 'severity', '-severity', 'code', '-code', 'column', '-column'],
  })
  @IsOptional()
  @IsIn(['row', '-row', 'severity', '-severity', 'code', '-code', 'column', '-column'])
  sort?: string;
}

export class SubmissionDto {
  @ApiProperty() id!: number;
  @ApiProperty({ enum: SUBMISSION_STATUSES }) status!: string;
  @ApiProperty({ example: 'Awaiting confirmation' }) statusLabel!: string;
  @ApiProperty({ nullable: true, enum: ['queued', 'uploading', 'reading'] }) phase!: string | null;
  @ApiProperty() isCurrent!: boolean;
  @ApiProperty({ description: '{ id, code, name }' }) practice!: object;
  @ApiProperty({ description: '{ id, year, quarter, label, windowStart, windowEnd, status }' })
  quarter!: object;
  @ApiProperty({
    description: 'Name, size, SHA-256, kind, sheet, date convention (the file itself is not kept)',
  })
  file!: object;
  @ApiProperty() uploadedBy!: string;
  @ApiProperty() uploadedAt!: string;
  @ApiProperty({ description: '{ rowsDone, rowsTotal }: a real progress bar while processing' })
  progress!: object;
  @ApiProperty({
    nullable: true,
    type: Object,
    description: 'Rows read, accepted, refused, blank; errors, warnings, flags',
  })
  counts!: object | null;
  @ApiProperty({ type: [Object], description: 'Issues by code: { code, severity, title, count }' })
  issuesByCode!: object[];
  @ApiProperty({
    nullable: true,
    type: Object,
    description: 'Why the file was refused: { code, title, message, fix }',
  })
  refusal!: object | null;
  @ApiProperty({
    nullable: true,
    type: Object,
    description: 'Why processing failed, and whether it can be retried',
  })
  failure!: object | null;
  @ApiProperty({ description: '{ confirm, cancel, retry }: what the caller may do now' })
  actions!: object;
}
