/** Browsing the audit trail (regional leads, and auditors as governance reviewers): read-only, newest first, filtered, paged. */
import { Controller, Get, Inject, Query } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { Roles } from '../auth/decorators.js';
import { AuditTrailService } from './audit-trail.service.js';
import { AuditActionDto, AuditEventPageDto, ListAuditEventsQuery } from './dto/audit-event.dto.js';
import { ApiProblems } from '../common/problem.dto.js';

@ApiProblems()
@ApiTags('audit trail')
@Controller('audit-events')
@Roles('regional_lead', 'auditor')
export class AuditTrailController {
  constructor(@Inject(AuditTrailService) private readonly audit: AuditTrailService) {}

  @Get()
  @ApiOperation({
    summary:
      "The region's audit trail (and events not tied to any region, such as refused sign-ins), newest first",
  })
  @ApiOkResponse({ type: AuditEventPageDto })
  list(
    @CurrentActor() actor: Actor,
    @Query() query: ListAuditEventsQuery,
  ): Promise<AuditEventPageDto> {
    return this.audit.browse(actor.regionId, query);
  }

  @Get('actions')
  @ApiOperation({ summary: 'The actions recorded so far, with counts (for the filter)' })
  @ApiOkResponse({ type: [AuditActionDto] })
  actions(@CurrentActor() actor: Actor): Promise<AuditActionDto[]> {
    return this.audit.actions(actor.regionId);
  }
}
