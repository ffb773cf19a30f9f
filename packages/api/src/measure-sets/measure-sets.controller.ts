import { Body, Controller, Delete, Get, HttpCode, Inject, Param, Post, Put } from '@nestjs/common';
import { ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, AnySignedIn, CurrentActor, Roles } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import {
  CloneMeasureSetDto,
  DiscardedMeasureSetDto,
  MeasureSetChangesDto,
  MeasureSetDto,
  MeasureSetSummaryDto,
  PublishMeasureSetDto,
  SaveMeasureSetDraftDto,
} from './dto/measure-set.dto.js';
import { MeasureSetsService } from './measure-sets.service.js';

@ApiProblems()
@ApiTags('measure sets')
@Controller('measure-sets')
export class MeasureSetsController {
  constructor(@Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService) {}

  @Get()
  @AnySignedIn()
  @ApiOperation({
    summary:
      'The measure-set versions you read: published ones, and your region’s drafts (regional lead, auditor), each with where it is used',
  })
  @ApiOkResponse({ type: [MeasureSetSummaryDto] })
  list(@CurrentActor() actor: Actor): Promise<MeasureSetSummaryDto[]> {
    return this.measureSets.summaries(actor);
  }

  @Get(':measureSetId')
  @AnySignedIn()
  @ApiOperation({
    summary:
      'One measure-set version: every care process and treatment target, its definition in words, population, denominator, direction and guideline, and the definition as stored',
  })
  @ApiOkResponse({ type: MeasureSetDto })
  get(
    @CurrentActor() actor: Actor,
    @Param('measureSetId') measureSetId: string,
  ): Promise<MeasureSetDto> {
    return this.measureSets.detail(actor, measureSetId);
  }

  @Get(':measureSetId/changes')
  @AnySignedIn()
  @ApiOperation({ summary: 'The differences from the version it was started from, in words' })
  @ApiOkResponse({ type: MeasureSetChangesDto })
  changes(
    @CurrentActor() actor: Actor,
    @Param('measureSetId') measureSetId: string,
  ): Promise<MeasureSetChangesDto> {
    return this.measureSets.changes(actor, measureSetId);
  }

  @Post(':measureSetId/drafts')
  @Roles('regional_lead')
  @ApiOperation({ summary: 'Start a draft from a published version (regional lead)' })
  @ApiCreatedResponse({ type: MeasureSetDto })
  clone(
    @CurrentActor() actor: Actor,
    @Param('measureSetId') measureSetId: string,
    @Body() body: CloneMeasureSetDto,
  ): Promise<MeasureSetDto> {
    return this.measureSets.clone(actor, measureSetId, body);
  }

  @Put(':measureSetId')
  @Roles('regional_lead')
  @ApiOperation({
    summary:
      'Save a draft’s whole definition (regional lead); refused with every problem and its field when the measure set is not valid',
  })
  @ApiOkResponse({ type: MeasureSetDto })
  save(
    @CurrentActor() actor: Actor,
    @Param('measureSetId') measureSetId: string,
    @Body() body: SaveMeasureSetDraftDto,
  ): Promise<MeasureSetDto> {
    return this.measureSets.save(actor, measureSetId, body);
  }

  @Post(':measureSetId/publish')
  @HttpCode(200)
  @Roles('regional_lead')
  @ApiOperation({ summary: 'Publish a draft as a new version, fixed for good (regional lead)' })
  @ApiOkResponse({ type: MeasureSetDto })
  publish(
    @CurrentActor() actor: Actor,
    @Param('measureSetId') measureSetId: string,
    @Body() body: PublishMeasureSetDto,
  ): Promise<MeasureSetDto> {
    return this.measureSets.publish(actor, measureSetId, body);
  }

  @Delete(':measureSetId')
  @Roles('regional_lead')
  @ApiOperation({ summary: 'Discard a draft (regional lead); a published version is kept' })
  @ApiOkResponse({ type: DiscardedMeasureSetDto })
  discard(
    @CurrentActor() actor: Actor,
    @Param('measureSetId') measureSetId: string,
  ): Promise<DiscardedMeasureSetDto> {
    return this.measureSets.discard(actor, measureSetId);
  }
}
