import type { ProblemException } from '../common/problem.js';
import { checkAttachment, kindOfBytes } from './attachment-check.js';

function refusalOf(work: () => unknown): { slug: string; status: number } {
  try {
    work();
  } catch (error) {
    const e = error as ProblemException;
    return { slug: e.slug, status: e.getStatus() };
  }
  throw new Error('not refused');
}

const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);
const PDF = Buffer.from('%PDF-1.7\n1 0 obj\n<<>>\nendobj\n');
const JPEG = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 16]);
const XLSX = Buffer.concat([
  Buffer.from([0x50, 0x4b, 0x03, 0x04]),
  Buffer.from('....[Content_Types].xml....xl/workbook.xml....', 'latin1'),
]);
const ZIP = Buffer.concat([
  Buffer.from([0x50, 0x4b, 0x03, 0x04]),
  Buffer.from('word/document.xml'),
]);
const CSV = Buffer.from('practice,rate\nOV102,0.61\n');
const EXE = Buffer.from([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00]);

describe('attachments judged by content', () => {
  it.each([
    [PNG, 'png'],
    [PDF, 'pdf'],
    [JPEG, 'jpeg'],
    [XLSX, 'xlsx'],
    [CSV, 'csv'],
    [ZIP, null],
    [EXE, null],
    [Buffer.from([0xc3, 0x28]), null], // not UTF-8
  ] as const)('%#: %s', (bytes, kind) => {
    expect(kindOfBytes(bytes)).toBe(kind);
  });

  it.each([
    ['plan.pdf', PDF, 'pdf'],
    ['photo.JPG', JPEG, 'jpeg'],
    ['photo.jpeg', JPEG, 'jpeg'],
    ['figures.xlsx', XLSX, 'xlsx'],
    ['figures.csv', CSV, 'csv'],
  ] as const)('accepts %s', (name, bytes, kind) => {
    expect(checkAttachment(name, bytes, false)).toBe(kind);
  });

  it.each([
    ['chart.pdf', PNG, 'attachment-name-misleading', 415],
    ['notes.csv', PDF, 'attachment-name-misleading', 415],
    ['figures', XLSX, 'attachment-name-misleading', 415],
    ['tool.pdf', EXE, 'attachment-type-not-allowed', 415],
    ['letter.docx', ZIP, 'attachment-type-not-allowed', 415],
    ['empty.csv', Buffer.alloc(0), 'attachment-empty', 422],
  ] as const)('refuses %s', (name, bytes, slug, status) => {
    expect(refusalOf(() => checkAttachment(name, bytes, false))).toEqual({ slug, status });
  });

  it('refuses a file cut at the size limit, or over it', () => {
    expect(refusalOf(() => checkAttachment('big.pdf', PDF, true))).toEqual({
      slug: 'attachment-too-large',
      status: 413,
    });
    expect(refusalOf(() => checkAttachment('big.pdf', PDF, false, 10)).slug).toBe(
      'attachment-too-large',
    );
  });
});
