import {
  applyDecorators,
  Controller,
  Get,
  Inject,
  Param,
  ParseIntPipe,
  Req,
  Res,
} from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { PracticeScoped, Roles } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import { PracticeResultsDetailDto, PracticeResultsDto } from './dto/practice-results.dto.js';
import { PracticeResultsService } from './practice-results.service.js';
import { sendAnswer } from './answers/send-answer.js';

/** Who reads a practice's results and detail: its own leads, the regional lead, the auditor. */
const PracticeReaders = () =>
  applyDecorators(Roles('practice_lead', 'regional_lead', 'auditor'), PracticeScoped('practiceId'));

/** One practice's results for an audit quarter: its leads, the regional lead, the auditor. */
@ApiProblems()
@ApiTags('practice results')
@Controller('practices/:practiceId/quarters/:quarterId')
export class PracticeResultsController {
  constructor(@Inject(PracticeResultsService) private readonly results: PracticeResultsService) {}

  @Get('results')
  @PracticeReaders()
  @ApiOperation({
    summary: "A practice's results for an audit quarter, against the region, with its trend",
    description:
      "Every measure and split: its own figures, the region's rate, median and limits at its n, its flags, change since the previous quarter, trend with run-chart signals and improvement potential; data-quality flags (the breakdowns, kidney grid, time to insulin and value histograms are on results/detail). Other practices appear only as region aggregates and unnamed points, under disclosure control for practice leads. A practice without a current submission: state no-current-submission, with the upload action. Sent with an ETag; If-None-Match with it gives 304 while nothing it was built from has changed.",
  })
  @ApiOkResponse({ type: PracticeResultsDto })
  async get(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    // The stored answer's bytes, with its ETag (304 when the reader has them).
    sendAnswer(req, res, await this.results.resultsAnswer(actor, practiceId, quarterId));
  }

  @Get('results/detail')
  @PracticeReaders()
  @ApiOperation({
    summary: "A practice's detail for an audit quarter, against the region",
    description:
      "Per measure and split, the practice's figures by breakdown category (age band, sex, deprivation, duration) beside the region's; the kidney grid (GFR × albuminuria categories); time from diagnosis to insulin (Kaplan–Meier) and value histograms, the practice against the region. The region's counts are under disclosure control for practice leads. builtFrom names the stored result it was built from, the same as the results it goes with. A practice without a current submission: state no-current-submission and no detail. Sent with an ETag; If-None-Match with it gives 304 while nothing it was built from has changed.",
  })
  @ApiOkResponse({ type: PracticeResultsDetailDto })
  async detail(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    sendAnswer(req, res, await this.results.detailAnswer(actor, practiceId, quarterId));
  }
}
