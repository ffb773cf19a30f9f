/** The digest routes' bodies and answers. */
import { ApiProperty } from '@nestjs/swagger';
import { IsISO8601 } from 'class-validator';
import { PracticeDto } from '../../organisations/dto/practice.dto.js';

export class DigestRecipientDto {
  @ApiProperty({ type: String }) address!: string;
  @ApiProperty({ type: String, nullable: true }) name!: string | null;
  @ApiProperty({ type: Boolean, description: 'A practice lead (false: an extra address)' })
  isUser!: boolean;
}

export class DigestAttachmentDto {
  @ApiProperty({ type: String, example: 'cairn-report-7-2026-Q3-OV102.xlsx' }) filename!: string;
  @ApiProperty({ type: String }) contentType!: string;
  @ApiProperty({ type: Number }) bytes!: number;
}

export class DigestReportRefDto {
  @ApiProperty({ type: Number, description: 'The source id of its digests' }) id!: number;
  @ApiProperty({ type: String, example: '2026 Q3 results' }) label!: string;
  @ApiProperty({ type: Number }) quarterId!: number;
  @ApiProperty({ type: String }) quarterLabel!: string;
  @ApiProperty({ type: String, format: 'date-time' }) publishedAt!: string;
  @ApiProperty({ type: Number, description: 'Practices with a part in it' }) practices!: number;
}

export class DigestPreviewDto {
  @ApiProperty({ type: DigestReportRefDto }) report!: DigestReportRefDto;
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({
    type: DigestRecipientDto,
    nullable: true,
    description: 'Whom the preview is addressed to (the first recipient); null when none',
  })
  addressedTo!: DigestRecipientDto | null;
  @ApiProperty({ type: [DigestRecipientDto], description: 'Everyone who will receive it' })
  recipients!: DigestRecipientDto[];
  @ApiProperty({ type: String }) from!: string;
  @ApiProperty({ type: String }) subject!: string;
  @ApiProperty({ type: String, description: 'The plain-text part, as sent' }) text!: string;
  @ApiProperty({
    type: String,
    description: 'Where the HTML part is served alone, as sent (for a sandboxed frame)',
  })
  htmlPath!: string;
  @ApiProperty({
    type: DigestAttachmentDto,
    nullable: true,
    description:
      'The practice’s data pack of the report (as on the report’s page); null when it has no figures in the report',
  })
  attachment!: DigestAttachmentDto | null;
  @ApiProperty({
    type: Boolean,
    description: 'False until a module that runs review cases counts them: every count is 0',
  })
  reviewCasesCounted!: boolean;
}

export class DigestTestSendDto {
  @ApiProperty({ type: String }) to!: string;
  @ApiProperty({ type: String }) messageId!: string;
  @ApiProperty({ type: String, description: "The mail server's reply" }) reply!: string;
}

export class DigestSendResultDto {
  @ApiProperty({ type: DigestReportRefDto }) report!: DigestReportRefDto;
  @ApiProperty({ type: Number, description: 'Practices whose digests were queued now' })
  practices!: number;
  @ApiProperty({ type: Number, description: 'Messages queued now' }) messages!: number;
  @ApiProperty({
    type: Number,
    description: 'Practices whose digests were queued before (never queued twice)',
  })
  alreadyQueued!: number;
}

export class ScheduleDigestsDto {
  @ApiProperty({
    type: String,
    format: 'date-time',
    example: '2026-12-10T08:00:00Z',
    description: 'When to send (in the future, at most a year ahead)',
  })
  @IsISO8601({ strict: true }, { message: 'sendAt must be a date and time (ISO 8601)' })
  sendAt!: string;
}

export const SCHEDULE_STATES = ['none', 'scheduled', 'sent', 'cancelled'] as const;

export class DigestScheduleDto {
  @ApiProperty({ type: DigestReportRefDto }) report!: DigestReportRefDto;
  @ApiProperty({ enum: SCHEDULE_STATES, enumName: 'DigestScheduleState' })
  state!: (typeof SCHEDULE_STATES)[number];
  @ApiProperty({ type: String, format: 'date-time', nullable: true }) sendAt!: string | null;
  @ApiProperty({ type: String, nullable: true }) scheduledBy!: string | null;
  @ApiProperty({ type: String, format: 'date-time', nullable: true }) ranAt!: string | null;
  @ApiProperty({ type: String, nullable: true }) outcome!: string | null;
}
