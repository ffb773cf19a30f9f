/** The regional lead's delivery page: what Cairn mailed, to whom, and what failed. */
import { Controller, Get, HttpCode, Inject, Param, ParseIntPipe, Post } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { Roles } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import { DeliveryDetailDto, DeliverySourceListDto, ResendResultDto } from './dto/mail.dto.js';
import { DeliveriesService } from './deliveries.service.js';

@ApiProblems()
@ApiTags('mail')
@Controller('mail')
@Roles('regional_lead')
export class DeliveriesController {
  constructor(@Inject(DeliveriesService) private readonly deliveries: DeliveriesService) {}

  @Get('deliveries')
  @ApiOperation({
    summary:
      "Every source of the region's e-mail (latest first) with its messages' counts by state",
  })
  @ApiOkResponse({ type: DeliverySourceListDto })
  list(@CurrentActor() actor: Actor): Promise<DeliverySourceListDto> {
    return this.deliveries.list(actor);
  }

  @Get('deliveries/:kind/:sourceId')
  @ApiOperation({
    summary: "One source's messages: each recipient, state, times, and the server's reply",
  })
  @ApiOkResponse({ type: DeliveryDetailDto })
  detail(
    @CurrentActor() actor: Actor,
    @Param('kind') kind: string,
    @Param('sourceId', ParseIntPipe) sourceId: number,
  ): Promise<DeliveryDetailDto> {
    return this.deliveries.detail(actor, kind, sourceId);
  }

  @Post('deliveries/:kind/:sourceId/resend')
  @HttpCode(200)
  @ApiOperation({ summary: "Sends a source's failed messages again" })
  @ApiOkResponse({ type: ResendResultDto })
  resendFailed(
    @CurrentActor() actor: Actor,
    @Param('kind') kind: string,
    @Param('sourceId', ParseIntPipe) sourceId: number,
  ): Promise<ResendResultDto> {
    return this.deliveries.resendFailed(actor, kind, sourceId);
  }

  @Post('messages/:messageId/resend')
  @HttpCode(200)
  @ApiOperation({ summary: 'Sends one failed message again' })
  @ApiOkResponse({ type: ResendResultDto })
  resendMessage(
    @CurrentActor() actor: Actor,
    @Param('messageId', ParseIntPipe) messageId: number,
  ): Promise<ResendResultDto> {
    return this.deliveries.resendMessage(actor, messageId);
  }
}
