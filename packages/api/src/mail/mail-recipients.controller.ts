/** Who receives each practice's mail; the regional lead adds and removes extra addresses. */
import { Body, Controller, Delete, Get, Inject, Param, ParseIntPipe, Post } from '@nestjs/common';
import { ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { PracticeScoped, Roles } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import { AddExtraRecipientDto, MailRecipientsDto, PracticeRecipientsDto } from './dto/mail.dto.js';
import { RecipientsService } from './recipients.service.js';

@ApiProblems()
@ApiTags('mail')
@Controller()
@Roles('regional_lead')
export class MailRecipientsController {
  constructor(@Inject(RecipientsService) private readonly recipients: RecipientsService) {}

  @Get('mail/recipients')
  @ApiOperation({
    summary:
      "Each active practice's mail recipients: its leads (and what they opted out of) and the extra addresses",
  })
  @ApiOkResponse({ type: MailRecipientsDto })
  list(@CurrentActor() actor: Actor): Promise<MailRecipientsDto> {
    return this.recipients.list(actor);
  }

  @Post('practices/:practiceId/mail-recipients')
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: "Adds an address to a practice's mail recipients" })
  @ApiCreatedResponse({ type: PracticeRecipientsDto })
  add(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Body() body: AddExtraRecipientDto,
  ): Promise<PracticeRecipientsDto> {
    return this.recipients.add(actor, practiceId, body);
  }

  @Delete('practices/:practiceId/mail-recipients/:recipientId')
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: "Removes an extra address from a practice's mail recipients" })
  @ApiOkResponse({ type: PracticeRecipientsDto })
  remove(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('recipientId', ParseIntPipe) recipientId: number,
  ): Promise<PracticeRecipientsDto> {
    return this.recipients.remove(actor, practiceId, recipientId);
  }
}
