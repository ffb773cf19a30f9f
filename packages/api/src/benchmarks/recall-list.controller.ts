import { Controller, Get, Inject, Param, ParseIntPipe, Query, Res } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { PracticeScoped, Roles } from '../auth/index.js';
import { CSV, fileResponse, XLSX } from '../common/file-response.js';
import { ApiProblems } from '../common/problem.dto.js';
import { RecallExportQueryDto, RecallListDto, RecallListQueryDto } from './dto/recall-list.dto.js';
import { type RecallDownload, RecallListService } from './recall-list.service.js';

const RECALL_READERS = ['practice_lead', 'regional_lead', 'auditor'] as const;

@ApiProblems()
@ApiTags('recall lists')
@Controller('practices/:practiceId/quarters/:quarterId')
export class RecallListController {
  constructor(@Inject(RecallListService) private readonly recall: RecallListService) {}

  @Get('recall-list')
  @Roles(...RECALL_READERS)
  @PracticeScoped('practiceId')
  @ApiOperation({
    summary:
      "A practice's records that count against it on one care process or treatment target in an audit quarter, paged",
    description:
      "Read from the practice's current submission for the quarter. The practice's own leads see its record references; regional leads and auditors see pseudonyms. 404 no-current-submission when the practice has no confirmed extract for the quarter.",
  })
  @ApiOkResponse({ type: RecallListDto })
  list(
    @CurrentActor() user: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Query() query: RecallListQueryDto,
  ): Promise<RecallListDto> {
    return this.recall.page(user, practiceId, quarterId, query);
  }

  @Get('recall-list.csv')
  @Roles(...RECALL_READERS)
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'The whole recall list of a measure as CSV (UTF-8)' })
  @ApiOkResponse(fileResponse(CSV, 'The recall list, one line per record, UTF-8'))
  async csv(
    @CurrentActor() user: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Query() query: RecallExportQueryDto,
    @Res() res: Response,
  ): Promise<void> {
    await this.send(res, await this.recall.download(user, practiceId, quarterId, query, 'csv'));
  }

  @Get('recall-list.xlsx')
  @Roles(...RECALL_READERS)
  @PracticeScoped('practiceId')
  @ApiOperation({
    summary: 'The whole recall list of a measure as XLSX, with a sheet about the measure',
  })
  @ApiOkResponse(fileResponse(XLSX, 'The recall list, and a sheet about the measure'))
  async xlsx(
    @CurrentActor() user: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Query() query: RecallExportQueryDto,
    @Res() res: Response,
  ): Promise<void> {
    await this.send(res, await this.recall.download(user, practiceId, quarterId, query, 'xlsx'));
  }

  private async send(res: Response, download: RecallDownload): Promise<void> {
    res.status(200);
    res.setHeader('Content-Type', download.contentType);
    res.setHeader('Content-Disposition', `attachment; filename="${download.fileName}"`);
    res.setHeader('Cache-Control', 'no-store');
    await download.write(res);
  }
}
