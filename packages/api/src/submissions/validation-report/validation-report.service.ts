/**
 * Downloads of a validation report, streamed (a report may list 100,000
 * issues): JSON (the summary and every issue), and XLSX of the refused rows
 * as given with an added "Cairn issues" column, so that a practice can fix
 * them in place. Every text written to the spreadsheet is neutralised
 * against formula injection; record references are pseudonymised for anyone
 * outside the practice (docs/methods.md §9).
 */
import type { Writable } from 'node:stream';
import { Inject, Injectable } from '@nestjs/common';
import ExcelJS from 'exceljs';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import type { Actor } from '../../auth/actor.js';
import { CAIRN_SECRETS } from '../../config/config.module.js';
import type { CairnSecrets } from '../../config/config.schema.js';
import { pseudonymiser } from '../extract-processor.js';
import { ISSUE_CODES, type IssueCodeKey } from '../format/issue-codes.js';
import { seesRecordRefs } from '../submission-policy.js';
import { summaryJson } from '../submission.repository.js';
import { type LoadedSubmission, toView } from '../submission-view.js';
import { neutralise } from '../../common/neutralise.js';

interface IssueRow {
  seq: number;
  severity: string;
  code: string;
  source_row: number | null;
  column_key: string | null;
  column_name: string | null;
  value_given: string | null;
  message: string;
  fix: string;
}

const PAGE = 5000;

@Injectable()
export class ValidationReportService {
  private readonly pseudonym: (practiceCode: string, ref: string) => string;

  constructor(
    @Inject(Sequelize) private readonly sequelize: Sequelize,
    @Inject(CAIRN_SECRETS) secrets: CairnSecrets,
  ) {
    this.pseudonym = pseudonymiser(secrets.CAIRN_PSEUDONYM_SECRET);
  }

  private async *issuePages(submissionId: number, rows?: number[]): AsyncGenerator<IssueRow[]> {
    if (rows) {
      if (rows.length === 0) return;
      yield await this.sequelize.query<IssueRow>(
        `SELECT seq, severity, code, source_row, column_key, column_name, value_given, message, fix
           FROM submission_issues WHERE submission_id = ? AND source_row IN (?) ORDER BY source_row, seq`,
        { replacements: [submissionId, rows], type: QueryTypes.SELECT },
      );
      return;
    }
    let after = 0;
    for (;;) {
      const page = await this.sequelize.query<IssueRow>(
        `SELECT seq, severity, code, source_row, column_key, column_name, value_given, message, fix
           FROM submission_issues WHERE submission_id = ? AND seq > ? ORDER BY seq LIMIT ${PAGE}`,
        { replacements: [submissionId, after], type: QueryTypes.SELECT },
      );
      if (page.length === 0) return;
      yield page;
      after = page[page.length - 1]!.seq;
      if (page.length < PAGE) return;
    }
  }

  private value(loaded: LoadedSubmission, user: Actor, issue: IssueRow): string | null {
    if (
      issue.column_key === 'record_ref' &&
      issue.value_given &&
      !seesRecordRefs(user, loaded.practice.id)
    ) {
      return this.pseudonym(loaded.practice.code, issue.value_given);
    }
    return issue.value_given;
  }

  async writeJson(loaded: LoadedSubmission, user: Actor, out: Writable): Promise<void> {
    const row = loaded.record;
    const write = (text: string) =>
      out.write(text)
        ? Promise.resolve()
        : new Promise<void>((resolve) => out.once('drain', () => resolve()));
    await write(
      `{"submission":${JSON.stringify(toView(loaded, user))},"recordRefsShown":${seesRecordRefs(user, row.practice_id)},"issues":[`,
    );
    let first = true;
    for await (const page of this.issuePages(row.id)) {
      let text = '';
      for (const issue of page) {
        text +=
          (first ? '' : ',') +
          JSON.stringify({
            row: issue.source_row,
            column: issue.column_name,
            columnKey: issue.column_key,
            value: this.value(loaded, user, issue),
            severity: issue.severity,
            code: issue.code,
            title: ISSUE_CODES[issue.code as IssueCodeKey]?.title ?? issue.code,
            message: issue.message,
            fix: issue.fix,
          });
        first = false;
      }
      await write(text);
    }
    await write(']}\n');
    out.end();
  }

  async writeRejectedRowsXlsx(loaded: LoadedSubmission, user: Actor, out: Writable): Promise<void> {
    const row = loaded.record;
    const summary = summaryJson(row);
    const header = summary.header ?? [];
    const refIndex = summary.refColumnIndex ?? null;
    const showRefs = seesRecordRefs(user, row.practice_id);
    const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({
      stream: out,
      useSharedStrings: false,
      useStyles: true,
    });
    const sheet = workbook.addWorksheet('rejected rows', {
      views: [{ state: 'frozen', ySplit: 1 }],
    });
    const headingRow = sheet.addRow(['row', ...header.map(neutralise), 'Cairn issues']);
    headingRow.font = { bold: true };
    headingRow.commit();
    sheet.getColumn(1).width = 8;
    sheet.getColumn(header.length + 2).width = 90;
    let after = 0;
    for (;;) {
      const rejected = await this.sequelize.query<{ source_row: number; cells: string | string[] }>(
        `SELECT source_row, cells FROM submission_rejected_rows WHERE submission_id = ? AND source_row > ? ORDER BY source_row LIMIT 1000`,
        { replacements: [row.id, after], type: QueryTypes.SELECT },
      );
      if (rejected.length === 0) break;
      const byRow = new Map<number, IssueRow[]>();
      for await (const page of this.issuePages(
        row.id,
        rejected.map((r) => r.source_row),
      )) {
        for (const issue of page) {
          const list = byRow.get(issue.source_row!);
          if (list) list.push(issue);
          else byRow.set(issue.source_row!, [issue]);
        }
      }
      for (const r of rejected) {
        const cells = (typeof r.cells === 'string' ? JSON.parse(r.cells) : r.cells) as string[];
        const values = cells.map((cell, i) =>
          neutralise(
            i === refIndex && !showRefs && cell
              ? this.pseudonym(loaded.practice.code, cell.trim())
              : cell,
          ),
        );
        while (values.length < header.length) values.push('');
        const issues = (byRow.get(r.source_row) ?? [])
          .map(
            (i) =>
              `${i.severity === 'error' ? 'Error' : i.severity === 'flag' ? 'Flag' : 'Warning'}${i.column_name ? ` (${i.column_name})` : ''}: ${i.message} ${i.fix}`,
          )
          .join('\n');
        const added = sheet.addRow([r.source_row, ...values, neutralise(issues)]);
        added.getCell(header.length + 2).alignment = { wrapText: true, vertical: 'top' };
        added.commit();
      }
      after = rejected[rejected.length - 1]!.source_row;
      if (rejected.length < 1000) break;
    }
    sheet.commit();
    const about = workbook.addWorksheet('about');
    about.getColumn(1).width = 28;
    about.getColumn(2).width = 70;
    const view = toView(loaded, user);
    const lines: [string, string | number][] = [
      ['practice', `${view.practice.name} (${view.practice.code})`],
      ['audit quarter', view.quarter.label],
      ['file', view.file.name],
      ['uploaded', `${view.uploadedAt} by ${view.uploadedBy}`],
      ['status', view.statusLabel],
      ['rows read', view.counts?.rowsRead ?? 0],
      ['rows accepted', view.counts?.rowsAccepted ?? 0],
      ['rows refused (on the other sheet)', view.counts?.rowsRejected ?? 0],
      [
        'record references',
        showRefs ? 'as given' : 'shown as pseudonyms (you are not a lead of this practice)',
      ],
    ];
    for (const [k, v] of lines)
      about.addRow([k, typeof v === 'string' ? neutralise(v) : v]).commit();
    about.commit();
    await workbook.commit();
  }
}
