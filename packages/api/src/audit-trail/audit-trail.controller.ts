/** Browsing the audit trail (regional leads, and auditors as governance reviewers): read-only, newest first, filtered, paged. */
import { Controller, Get, Inject, Query } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { AuthUser } from '../auth/auth-user.js';
import { CurrentUser, Roles } from '../auth/decorators.js';
import { AuditTrailService } from './audit-trail.service.js';
import { AuditActionDto, AuditEventPageDto, ListAuditEventsQuery } from './dto/audit-event.dto.js';

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
    @CurrentUser() user: AuthUser,
    @Query() query: ListAuditEventsQuery,
  ): Promise<AuditEventPageDto> {
    return this.audit.browse(user.regionId, query);
  }

  @Get('actions')
  @ApiOperation({ summary: 'The actions recorded so far, with counts (for the filter)' })
  @ApiOkResponse({ type: [AuditActionDto] })
  actions(@CurrentUser() user: AuthUser): Promise<AuditActionDto[]> {
    return this.audit.actions(user.regionId);
  }
}
