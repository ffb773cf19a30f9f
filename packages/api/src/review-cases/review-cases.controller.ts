import {
  Body,
  Controller,
  Get,
  HttpCode,
  HttpStatus,
  Inject,
  Param,
  ParseIntPipe,
  Post,
  Query,
  Req,
  Res,
} from '@nestjs/common';
import { ApiBody, ApiConsumes, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { AnySignedIn, AuditorMayWrite, Roles } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import { readAnswerForm } from './answer-form.js';
import {
  AnswerFormDto,
  CommentDto,
  ListCasesQueryDto,
  OpenCaseDto,
  ReviewCaseDto,
  ReviewCaseListDto,
  TransitionDto,
} from './dto/review-case.dto.js';
import { ReviewCasesService } from './review-cases.service.js';

/** Review cases: auditors open and run them; practice leads see and answer their own. */
@ApiProblems()
@ApiTags('review-cases')
@Controller('review-cases')
export class ReviewCasesController {
  constructor(@Inject(ReviewCasesService) private readonly cases: ReviewCasesService) {}

  @Get()
  @AnySignedIn()
  @ApiOperation({
    summary:
      'Review cases the reader may see (practice leads: their practices’ only), newest first',
  })
  @ApiOkResponse({ type: ReviewCaseListDto })
  list(
    @CurrentActor() actor: Actor,
    @Query() query: ListCasesQueryDto,
  ): Promise<ReviewCaseListDto> {
    return this.cases.list(actor, query);
  }

  @Post()
  @Roles('auditor')
  @AuditorMayWrite()
  @ApiOperation({
    summary: 'Open a review case on a practice × measure × quarter, freezing its current figures',
    description:
      '409 case-already-open (with its caseId) when one is not closed yet; 409 no-figures-to-review without a current submission.',
  })
  @ApiOkResponse({ type: ReviewCaseDto })
  open(@CurrentActor() actor: Actor, @Body() body: OpenCaseDto): Promise<ReviewCaseDto> {
    return this.cases.open(actor, body);
  }

  @Get(':caseId')
  @AnySignedIn()
  @ApiOperation({
    summary:
      'One review case: frozen figures, timeline (internal notes only for the region’s side), allowed actions',
  })
  @ApiOkResponse({ type: ReviewCaseDto })
  get(
    @CurrentActor() actor: Actor,
    @Param('caseId', ParseIntPipe) caseId: number,
  ): Promise<ReviewCaseDto> {
    return this.cases.get(actor, caseId);
  }

  @Post(':caseId/transitions')
  @HttpCode(HttpStatus.OK)
  @Roles('auditor')
  @AuditorMayWrite()
  @ApiOperation({
    summary: 'Ask the practice, close with a finding, or reopen',
    description:
      '409 case-changed (with the case as it is) when expectedVersion is not the current version; 409 case-closed or case-wrong-state when the action does not apply.',
  })
  @ApiOkResponse({ type: ReviewCaseDto })
  transition(
    @CurrentActor() actor: Actor,
    @Param('caseId', ParseIntPipe) caseId: number,
    @Body() body: TransitionDto,
  ): Promise<ReviewCaseDto> {
    return this.cases.transition(actor, caseId, body);
  }

  @Post(':caseId/comments')
  @HttpCode(HttpStatus.OK)
  @Roles('auditor', 'practice_lead')
  @AuditorMayWrite()
  @ApiOperation({
    summary: 'Add a comment the practice sees, or (auditors) an internal note; append-only',
  })
  @ApiOkResponse({ type: ReviewCaseDto })
  comment(
    @CurrentActor() actor: Actor,
    @Param('caseId', ParseIntPipe) caseId: number,
    @Body() body: CommentDto,
  ): Promise<ReviewCaseDto> {
    return this.cases.comment(actor, caseId, body);
  }

  @Post(':caseId/answers')
  @HttpCode(HttpStatus.OK)
  @Roles('practice_lead')
  @ApiConsumes('multipart/form-data')
  @ApiBody({ type: AnswerFormDto })
  @ApiOperation({
    summary: 'The practice’s answer, with up to 5 attachments checked by content and size',
    description:
      '413 attachment-too-large, 415 attachment-type-not-allowed or attachment-name-misleading, 422 empty-text, 409 case-closed or case-changed; nothing is stored on any of them.',
  })
  @ApiOkResponse({ type: ReviewCaseDto })
  async answer(
    @CurrentActor() actor: Actor,
    @Param('caseId', ParseIntPipe) caseId: number,
    @Req() req: Request,
  ): Promise<ReviewCaseDto> {
    return this.cases.answer(actor, caseId, await readAnswerForm(req));
  }

  @Get(':caseId/files/:fileId')
  @AnySignedIn()
  @ApiOperation({ summary: 'Download an attachment of a review case' })
  @ApiOkResponse({
    description: 'The file as it was received',
    content: { 'application/octet-stream': { schema: { type: 'string', format: 'binary' } } },
  })
  async file(
    @CurrentActor() actor: Actor,
    @Param('caseId', ParseIntPipe) caseId: number,
    @Param('fileId', ParseIntPipe) fileId: number,
    @Res() res: Response,
  ): Promise<void> {
    const file = await this.cases.file(actor, caseId, fileId);
    res.setHeader('Content-Type', file.mediaType);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="${file.fileName.replace(/[^\w.\- ]/g, '_')}"`,
    );
    res.send(file.bytes);
  }
}
