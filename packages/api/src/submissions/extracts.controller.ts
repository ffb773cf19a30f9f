import { Controller, Get, Inject, Res } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { AnySignedIn, Public } from '../auth/index.js';
import type { CairnConfig } from '../config/config.schema.js';
import { fileResponse, XLSX } from '../common/file-response.js';
import { ExtractFormatDto, UploadOptionsDto } from './dto/submission.dto.js';
import { COLUMNS, unitsOf } from './format/columns.js';
import { allowedValues, requiredLabel } from './format/describe.js';
import { ISSUE_CODES } from './format/issue-codes.js';
import { SubmissionsService } from './submissions.service.js';
import { buildCsvTemplate, buildXlsxTemplate } from './template/template.js';
import { ApiProblems } from '../common/problem.dto.js';

@ApiProblems()
@ApiTags('extracts')
@Controller('extracts')
export class ExtractsController {
  private xlsx: Promise<Buffer> | null = null;

  constructor(
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
  ) {}

  @Get('template.xlsx')
  @Public()
  @ApiOperation({
    summary:
      'The extract template as XLSX: data sheet with drop-downs, data dictionary, instructions',
  })
  @ApiOkResponse(fileResponse(XLSX, 'The template workbook'))
  async templateXlsx(@Res() res: Response) {
    this.xlsx ??= buildXlsxTemplate(this.config.get('extracts', { infer: true }).maxRows);
    res.setHeader(
      'Content-Type',
      'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    );
    res.setHeader('Content-Disposition', 'attachment; filename="cairn-extract-template.xlsx"');
    res.send(await this.xlsx);
  }

  @Get('template.csv')
  @Public()
  @ApiOperation({ summary: 'The extract template as CSV (headings only, UTF-8)' })
  @ApiOkResponse(fileResponse('text/csv', 'The headings, UTF-8'))
  templateCsv(@Res() res: Response) {
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', 'attachment; filename="cairn-extract-template.csv"');
    res.send(buildCsvTemplate());
  }

  @Get('format')
  @Public()
  @ApiOperation({
    summary:
      "Cairn's extract format: every column, its allowed values and units, and every issue code",
  })
  @ApiOkResponse({ type: ExtractFormatDto })
  format(): ExtractFormatDto {
    const limits = this.config.get('extracts', { infer: true });
    return {
      limits: { maxBytes: limits.maxBytes, maxRows: limits.maxRows },
      columns: COLUMNS.map((def) => ({
        key: def.key,
        group: def.group,
        meaning: def.meaning,
        allowed: allowedValues(def),
        required: requiredLabel(def),
        columnRequired: def.required,
        valueRequired: def.valueRequired,
        units: unitsOf(def).map((u) => u.code),
        codes: def.codes?.map((c) => c.value) ?? null,
        example: def.example,
      })),
      issueCodes: Object.entries(ISSUE_CODES).map(([code, def]) => ({
        code,
        severity: def.severity,
        title: def.title,
      })),
    };
  }

  @Get('upload-options')
  @AnySignedIn()
  @ApiOperation({
    summary:
      'Where you may send extracts: the practices, and for each the audit quarters it may take one for',
  })
  @ApiOkResponse({ type: UploadOptionsDto })
  uploadOptions(@CurrentActor() actor: Actor): Promise<UploadOptionsDto> {
    return this.submissions.uploadOptions(actor);
  }
}
