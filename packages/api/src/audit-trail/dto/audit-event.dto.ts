import { ApiProperty } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  IsIn,
  IsInt,
  IsISO8601,
  IsOptional,
  IsString,
  Matches,
  Max,
  MaxLength,
  Min,
} from 'class-validator';
import { PracticeRefDto } from '../../organisations/dto/practice.dto.js';
import { AUDIT_OUTCOMES, type AuditOutcome } from '../models/audit-event.model.js';

export class AuditEventDto {
  @ApiProperty({ type: Number })
  id!: number;

  @ApiProperty({ type: String, description: 'ISO 8601' })
  occurredAt!: string;

  @ApiProperty({ type: String, example: 'auth.sign_in', description: 'For support and filters' })
  action!: string;

  @ApiProperty({ type: String, example: 'Signed in', description: 'The action in words' })
  actionLabel!: string;

  @ApiProperty({ enum: AUDIT_OUTCOMES, enumName: 'AuditOutcome' })
  outcome!: AuditOutcome;

  @ApiProperty({ nullable: true, type: Number })
  actorUserId!: number | null;

  @ApiProperty({ type: String, example: 'imogen.varley@ostrevale.example' })
  actorLabel!: string;

  @ApiProperty({ nullable: true, type: PracticeRefDto, description: 'The practice concerned' })
  practice!: PracticeRefDto | null;

  @ApiProperty({ nullable: true, type: String })
  subjectType!: string | null;

  @ApiProperty({ nullable: true, type: String })
  subjectId!: string | null;

  @ApiProperty({ type: String })
  summary!: string;

  @ApiProperty({
    nullable: true,
    type: 'object',
    additionalProperties: true,
    description: 'What the event recorded beyond its summary; its keys depend on the action',
  })
  detail!: Record<string, unknown> | null;

  @ApiProperty({ nullable: true, type: String })
  requestId!: string | null;

  @ApiProperty({ nullable: true, type: String })
  ipAddress!: string | null;
}

export class AuditEventPageDto {
  @ApiProperty({ type: [AuditEventDto], description: 'Newest first' })
  events!: AuditEventDto[];

  @ApiProperty({
    nullable: true,
    type: Number,
    description: 'Pass as `before` for the next (older) page; null when there is none',
  })
  nextBefore!: number | null;
}

export class AuditActionDto {
  @ApiProperty({ type: String, example: 'auth.sign_in' })
  action!: string;

  @ApiProperty({ type: String, example: 'Signed in', description: 'The action in words' })
  label!: string;

  @ApiProperty({
    type: String,
    example: 'auth.',
    description: 'The group it belongs to, as a filter prefix',
  })
  group!: string;

  @ApiProperty({
    type: String,
    example: 'Sign-ins and sign-outs',
    description: 'The group in words',
  })
  groupLabel!: string;

  @ApiProperty({ type: Number })
  count!: number;
}

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

export class ListAuditEventsQuery {
  @ApiProperty({
    required: false,
    example: 'auth.sign_in_refused',
    description: 'Exact action, or a prefix ending in "." (e.g. "auth.")',
  })
  @IsOptional()
  @Matches(/^[a-z_]+(\.[a-z_]+)*\.?$/, {
    message: 'action must be a dotted action name such as auth.sign_in',
  })
  action?: string;

  @ApiProperty({ required: false, enum: AUDIT_OUTCOMES, enumName: 'AuditOutcome' })
  @IsOptional()
  @IsIn(AUDIT_OUTCOMES, { message: `outcome must be one of: ${AUDIT_OUTCOMES.join(', ')}` })
  outcome?: AuditOutcome;

  @ApiProperty({
    required: false,
    description: 'Part of who acted (an e-mail address) or of the summary',
  })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(100)
  search?: string;

  @ApiProperty({ required: false, type: Number })
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'practiceId must be a whole number' })
  @Min(1)
  practiceId?: number;

  @ApiProperty({ required: false, description: 'From this date or time (ISO 8601)' })
  @IsOptional()
  @IsISO8601({ strict: true }, { message: 'from must be a date such as 2026-07-01' })
  from?: string;

  @ApiProperty({ required: false, description: 'Up to and including this date (ISO 8601)' })
  @IsOptional()
  @IsISO8601({ strict: true }, { message: 'to must be a date such as 2026-09-30' })
  to?: string;

  @ApiProperty({ required: false, description: 'Only events older than this id (paging)' })
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'before must be a whole number' })
  @Min(1)
  before?: number;

  @ApiProperty({ required: false, default: 100, maximum: 500 })
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'limit must be a whole number' })
  @Min(1)
  @Max(500)
  limit?: number;
}
