import { Controller, Get, Inject } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { Public } from '../auth/decorators.js';
import { AboutDto } from './dto/about.dto.js';
import { OrganisationsService } from './organisations.service.js';
import { ApiProblems } from '../common/problem.dto.js';

/** Public facts for the signed-out landing page: no personal or practice-level data. */
@ApiProblems()
@ApiTags('about')
@Public()
@Controller('about')
export class AboutController {
  constructor(@Inject(OrganisationsService) private readonly organisations: OrganisationsService) {}

  @Get()
  @ApiOperation({ summary: 'What this deployment is (public, for the landing page)' })
  @ApiOkResponse({ type: AboutDto })
  about(): Promise<AboutDto> {
    return this.organisations.about();
  }
}
