/** The mail module's requests and responses: deliveries, recipients, mail preferences. */
import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayUnique,
  IsArray,
  IsEmail,
  IsIn,
  IsOptional,
  IsString,
  MaxLength,
} from 'class-validator';
import { PracticeDto, PracticeRefDto } from '../../organisations/dto/practice.dto.js';
import { ROLES, type Role } from '../../users/roles.js';
import { MAIL_KINDS, type MailKind } from '../mail-kinds.js';
import { OUTBOX_STATES, type OutboxState } from '../outbox-policy.js';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

// ── deliveries ──

export class OutboxCountsDto {
  @ApiProperty({ type: Number }) queued!: number;
  @ApiProperty({ type: Number }) sending!: number;
  @ApiProperty({ type: Number }) sent!: number;
  @ApiProperty({ type: Number }) failed!: number;
  @ApiProperty({ type: Number }) total!: number;
}

export class DeliverySourceActionsDto {
  @ApiProperty({ type: Boolean, description: 'Whether failed messages can be sent again' })
  resendFailed!: boolean;
}

/** One source of messages: a quarter's opening message, a quarter's reminders… */
export class DeliverySourceDto {
  @ApiProperty({ enum: MAIL_KINDS, enumName: 'MailKind' })
  kind!: MailKind;

  @ApiProperty({ type: Number, description: 'What the messages are about (an audit quarter id)' })
  sourceId!: number;

  @ApiProperty({ type: String, example: '2026 Q4 opening message' })
  label!: string;

  @ApiProperty({ type: String, description: 'When the first message was queued, ISO 8601' })
  firstQueuedAt!: string;

  @ApiProperty({ type: String, description: 'The latest queueing or attempt, ISO 8601' })
  lastActivityAt!: string;

  @ApiProperty({ type: Number, description: 'Practices the source was sent for' })
  practices!: number;

  @ApiProperty({
    type: Number,
    description: 'Practices that had nobody to write to (no active lead receiving this kind)',
  })
  practicesWithoutRecipients!: number;

  @ApiProperty({ type: OutboxCountsDto })
  counts!: OutboxCountsDto;

  @ApiProperty({ type: DeliverySourceActionsDto })
  actions!: DeliverySourceActionsDto;
}

export class DeliverySourceListDto {
  @ApiProperty({ type: [DeliverySourceDto], description: 'Latest first' })
  sources!: DeliverySourceDto[];
}

export class DeliveryMessageActionsDto {
  @ApiProperty({ type: Boolean, description: 'Whether this (failed) message can be sent again' })
  resend!: boolean;
}

export class DeliveryMessageDto {
  @ApiProperty({ type: Number })
  id!: number;

  @ApiProperty({ type: PracticeRefDto })
  practice!: PracticeRefDto;

  @ApiProperty({ type: String, example: 'priya.calloway@quarrybank.example' })
  recipient!: string;

  @ApiProperty({ type: String, nullable: true, description: "The person's name, when a lead" })
  recipientName!: string | null;

  @ApiProperty({ enum: OUTBOX_STATES, enumName: 'OutboxState' })
  state!: OutboxState;

  @ApiProperty({ type: Number, description: 'Attempts so far (since the last resend)' })
  attempts!: number;

  @ApiProperty({
    type: Number,
    description:
      'Times the message was taken up again after its sender stopped mid-send (it may then have arrived twice, with the same Message-ID)',
  })
  resumed!: number;

  @ApiProperty({ type: String, description: 'ISO 8601' })
  queuedAt!: string;

  @ApiProperty({ type: String, nullable: true, description: 'The next attempt (queued), ISO 8601' })
  nextAttemptAt!: string | null;

  @ApiProperty({ type: String, nullable: true, description: 'ISO 8601' })
  lastAttemptAt!: string | null;

  @ApiProperty({
    type: String,
    nullable: true,
    description: 'When the server accepted it, ISO 8601',
  })
  sentAt!: string | null;

  @ApiProperty({ type: String, nullable: true, description: 'ISO 8601' })
  failedAt!: string | null;

  @ApiProperty({
    type: String,
    nullable: true,
    description: "The server's reply to the last failed attempt, or what went wrong",
  })
  lastError!: string | null;

  @ApiProperty({ type: Number, nullable: true, description: 'Its SMTP reply code, if any' })
  lastReplyCode!: number | null;

  @ApiProperty({ type: String, nullable: true, example: '<outbox-42.region-1@cairn.example.org>' })
  messageId!: string | null;

  @ApiProperty({ type: DeliveryMessageActionsDto })
  actions!: DeliveryMessageActionsDto;
}

export class DeliveryDetailDto {
  @ApiProperty({ type: DeliverySourceDto })
  source!: DeliverySourceDto;

  @ApiProperty({ type: [DeliveryMessageDto], description: 'Failed first, then by practice' })
  messages!: DeliveryMessageDto[];

  @ApiProperty({ type: [PracticeRefDto], description: 'Practices that had nobody to write to' })
  practicesWithoutRecipients!: PracticeRefDto[];
}

export class ResendResultDto {
  @ApiProperty({ type: Number, description: 'Messages queued again' })
  resent!: number;

  @ApiProperty({ type: DeliveryDetailDto })
  delivery!: DeliveryDetailDto;
}

// ── recipients ──

export class PracticeLeadRecipientDto {
  @ApiProperty({ type: Number })
  userId!: number;

  @ApiProperty({ type: String })
  displayName!: string;

  @ApiProperty({ type: String })
  email!: string;

  @ApiProperty({
    enum: MAIL_KINDS,
    enumName: 'MailKind',
    isArray: true,
    description: 'Kinds of e-mail this lead chose not to receive (on their profile)',
  })
  optedOut!: MailKind[];
}

export class ExtraRecipientActionsDto {
  @ApiProperty({ type: Boolean })
  remove!: boolean;
}

export class ExtraRecipientDto {
  @ApiProperty({ type: Number })
  id!: number;

  @ApiProperty({ type: String, example: 'reception@quarrybank.example' })
  address!: string;

  @ApiProperty({ type: String, nullable: true, example: 'Practice manager' })
  note!: string | null;

  @ApiProperty({ type: String, description: 'Who added it (e-mail address)' })
  addedBy!: string;

  @ApiProperty({ type: String, description: 'ISO 8601' })
  addedAt!: string;

  @ApiProperty({ type: ExtraRecipientActionsDto })
  actions!: ExtraRecipientActionsDto;
}

export class PracticeRecipientsActionsDto {
  @ApiProperty({ type: Boolean, description: 'Whether another address can be added' })
  addRecipient!: boolean;
}

export class PracticeRecipientsDto {
  @ApiProperty({ type: PracticeDto })
  practice!: PracticeDto;

  @ApiProperty({ type: [PracticeLeadRecipientDto], description: 'Active practice leads' })
  leads!: PracticeLeadRecipientDto[];

  @ApiProperty({ type: [ExtraRecipientDto], description: 'Addresses the regional lead added' })
  extras!: ExtraRecipientDto[];

  @ApiProperty({ type: PracticeRecipientsActionsDto })
  actions!: PracticeRecipientsActionsDto;
}

export class MailRecipientsDto {
  @ApiProperty({ type: [PracticeRecipientsDto], description: "The region's active practices" })
  practices!: PracticeRecipientsDto[];

  @ApiProperty({ type: Number, description: 'Extra addresses a practice may have at most' })
  maxExtrasPerPractice!: number;
}

export class AddExtraRecipientDto {
  @ApiProperty({ type: String, maxLength: 254, example: 'reception@quarrybank.example' })
  @Transform(trim)
  @IsString()
  @MaxLength(254)
  @IsEmail({ require_tld: true, allow_display_name: false, allow_ip_domain: false })
  address!: string;

  @ApiProperty({
    type: String,
    required: false,
    maxLength: 100,
    description: 'Who this is, for the regional lead (e.g. "Practice manager")',
  })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @MaxLength(100)
  note?: string;
}

// ── mail preferences ──

export class MailPreferenceDto {
  @ApiProperty({ enum: MAIL_KINDS, enumName: 'MailKind' })
  kind!: MailKind;

  @ApiProperty({ type: String, example: 'Submission deadline reminders' })
  label!: string;

  @ApiProperty({ type: String })
  description!: string;

  @ApiProperty({ enum: ROLES, enumName: 'Role', isArray: true, description: 'Who is sent it' })
  sentTo!: Role[];

  @ApiProperty({ type: Boolean, description: 'Whether your role is sent this kind' })
  appliesToYou!: boolean;

  @ApiProperty({ type: Boolean, description: 'False when you chose not to receive it' })
  receive!: boolean;
}

export class MailPreferencesDto {
  @ApiProperty({ type: [MailPreferenceDto] })
  preferences!: MailPreferenceDto[];
}

export class UpdateMailPreferencesDto {
  @ApiProperty({
    enum: MAIL_KINDS,
    enumName: 'MailKind',
    isArray: true,
    description: 'Every kind of e-mail you do not want (an empty list: receive them all)',
  })
  @IsArray({ message: 'optedOut must be a list of kinds of e-mail' })
  @ArrayMaxSize(MAIL_KINDS.length)
  @ArrayUnique({ message: 'optedOut must name each kind once' })
  @IsIn(MAIL_KINDS as unknown as string[], {
    each: true,
    message: `optedOut must name only kinds of e-mail Cairn sends: ${MAIL_KINDS.join(', ')}`,
  })
  optedOut!: MailKind[];
}
