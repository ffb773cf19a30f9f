import {
  Body,
  Controller,
  Get,
  HttpCode,
  Inject,
  Param,
  ParseIntPipe,
  Patch,
  Post,
} from '@nestjs/common';
import { ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { AnySignedIn, Roles } from '../auth/index.js';
import {
  OpenQuarterDto,
  QuarterDto,
  ReopenQuarterDto,
  UpdateQuarterDto,
} from './dto/quarter.dto.js';
import { QuartersService } from './quarters.service.js';
import { ApiProblems } from '../common/problem.dto.js';

@ApiProblems()
@ApiTags('quarters')
@Controller('quarters')
export class QuartersController {
  constructor(@Inject(QuartersService) private readonly quarters: QuartersService) {}

  @Get()
  @AnySignedIn()
  @ApiOperation({ summary: 'The audit quarters of your region, latest first' })
  @ApiOkResponse({ type: [QuarterDto] })
  list(@CurrentActor() actor: Actor): Promise<QuarterDto[]> {
    return this.quarters.list(actor.regionId);
  }

  @Get(':quarterId')
  @AnySignedIn()
  @ApiOperation({ summary: 'One audit quarter' })
  @ApiOkResponse({ type: QuarterDto })
  get(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
  ): Promise<QuarterDto> {
    return this.quarters.get(actor, quarterId);
  }

  @Post()
  @Roles('regional_lead')
  @ApiOperation({ summary: 'Open an audit quarter for submissions (regional lead)' })
  @ApiCreatedResponse({ type: QuarterDto })
  open(@CurrentActor() actor: Actor, @Body() body: OpenQuarterDto): Promise<QuarterDto> {
    return this.quarters.open(actor, body);
  }

  @Post(':quarterId/close')
  @HttpCode(200)
  @Roles('regional_lead')
  @ApiOperation({ summary: 'Close a quarter to practice uploads (regional lead)' })
  @ApiOkResponse({ type: QuarterDto })
  close(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
  ): Promise<QuarterDto> {
    return this.quarters.setStatus(actor, quarterId, 'closed');
  }

  @Post(':quarterId/reopen')
  @HttpCode(200)
  @Roles('regional_lead')
  @ApiOperation({
    summary: 'Reopen a closed quarter, optionally with a new deadline (regional lead)',
  })
  @ApiOkResponse({ type: QuarterDto })
  reopen(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Body() body: ReopenQuarterDto,
  ): Promise<QuarterDto> {
    return this.quarters.setStatus(actor, quarterId, 'open', body);
  }

  @Patch(':quarterId')
  @Roles('regional_lead')
  @ApiOperation({
    summary:
      'Move the deadline of a quarter, or change its measure-set version while it is open and no report has been published from it (regional lead)',
  })
  @ApiOkResponse({ type: QuarterDto })
  update(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Body() body: UpdateQuarterDto,
  ): Promise<QuarterDto> {
    return this.quarters.update(actor, quarterId, body);
  }
}
