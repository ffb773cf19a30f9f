/**
 * A practice's figures as an XLSX workbook (exceljs): one row per measure and
 * split with the practice's counts, rate and interval, the region's median and
 * rate, the flag in words and the improvement potential; a second sheet says
 * what the workbook is and carries the clinical caution. Used as the digest's
 * attachment when the report offers no data pack of its own.
 */
import ExcelJS from 'exceljs';
import type { PracticeResultsDto } from '../benchmarks/dto/practice-results.dto.js';

const SPLIT_WORDS = { all: 'All', type1: 'Type 1', type2_other: 'Type 2 and other' } as const;

export async function figuresWorkbook(
  results: PracticeResultsDto,
  about: { reportLabel: string; publishedAt: string },
): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  workbook.creator = 'Cairn';
  // Fixed dates: the same report gives the same workbook.
  workbook.created = new Date(about.publishedAt);
  workbook.modified = new Date(about.publishedAt);
  const sheet = workbook.addWorksheet('Measures');
  sheet.columns = [
    { header: 'Measure', key: 'label', width: 44 },
    { header: 'Kind', key: 'kind', width: 18 },
    { header: 'People', key: 'split', width: 18 },
    { header: 'Counted (n)', key: 'n', width: 12 },
    { header: 'Meeting it', key: 'events', width: 12 },
    { header: 'Rate', key: 'rate', width: 10 },
    { header: 'Interval lower (95 %)', key: 'lower', width: 14 },
    { header: 'Interval upper (95 %)', key: 'upper', width: 14 },
    { header: 'Region median', key: 'median', width: 14 },
    { header: 'Region rate', key: 'regionRate', width: 12 },
    { header: 'Against the limits', key: 'flag', width: 30 },
    { header: 'People to reach the median', key: 'improvement', width: 16 },
    { header: 'Guideline source', key: 'source', width: 60 },
  ];
  sheet.getRow(1).font = { bold: true };
  sheet.views = [{ state: 'frozen', ySplit: 1 }];
  for (const { measure, splits } of results.measures) {
    for (const s of splits) {
      const f = s.own.adjusted;
      sheet.addRow({
        label: measure.label,
        kind: measure.kind === 'care_process' ? 'Care process' : 'Treatment target',
        split: SPLIT_WORDS[s.split],
        n: s.own.n,
        events: s.own.events,
        rate: s.own.rate,
        lower: s.own.interval.lower,
        upper: s.own.interval.upper,
        median: s.region.median,
        regionRate: s.region.rate,
        flag:
          f.band === null
            ? 'no one counted'
            : f.band === 'within'
              ? 'within'
              : `${f.band} ${f.side ?? ''} (${f.assessment ?? ''})`.replace(/\s+/g, ' '),
        improvement: s.improvement.records,
        source: measure.source,
      });
    }
  }
  for (const key of ['rate', 'lower', 'upper', 'median', 'regionRate'])
    sheet.getColumn(key).numFmt = '0.0%';
  const aboutSheet = workbook.addWorksheet('About');
  aboutSheet.columns = [{ width: 28 }, { width: 90 }];
  for (const row of [
    ['Practice', `${results.practice.name} (${results.practice.code})`],
    ['Audit quarter', results.quarter.label],
    ['Made from', `${about.reportLabel}, published ${about.publishedAt.slice(0, 10)}`],
    [
      'Region figures',
      'Under disclosure control: counts of 1–4 are shown as “< 5” and rates of fewer than 10 people are withheld.',
    ],
    ['Caution', results.caution],
  ])
    aboutSheet.addRow(row);
  aboutSheet.getColumn(1).font = { bold: true };
  return Buffer.from(await workbook.xlsx.writeBuffer());
}
