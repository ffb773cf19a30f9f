import { Controller, Get, Inject, Param } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { AnySignedIn } from '../auth/index.js';
import { MeasureSetDto, MeasureSetSummaryDto } from './dto/measure-set.dto.js';
import { MeasureSetsService } from './measure-sets.service.js';

@ApiTags('measure sets')
@Controller('measure-sets')
export class MeasureSetsController {
  constructor(@Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService) {}

  @Get()
  @AnySignedIn()
  @ApiOperation({ summary: 'Every measure-set version Cairn knows' })
  @ApiOkResponse({ type: [MeasureSetSummaryDto] })
  list(): Promise<MeasureSetSummaryDto[]> {
    return this.measureSets.summaries();
  }

  @Get(':measureSetId')
  @AnySignedIn()
  @ApiOperation({
    summary:
      'One measure-set version: every care process and treatment target, its definition in words, population, denominator, direction and guideline',
  })
  @ApiOkResponse({ type: MeasureSetDto })
  get(@Param('measureSetId') measureSetId: string): Promise<MeasureSetDto> {
    return this.measureSets.detail(measureSetId);
  }
}
