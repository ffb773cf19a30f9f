/** Reading downloads in the e2e tests: a binary response body, a workbook's cells. */
import ExcelJS from 'exceljs';
import type request from 'supertest';

/** Reads a binary response body as a Buffer. */
export const binary = (req: request.Test) =>
  req.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });

/** Every sheet's cell values, by sheet name. */
export async function cellsOf(bytes: Buffer): Promise<Record<string, unknown[][]>> {
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(bytes as unknown as ArrayBuffer);
  const out: Record<string, unknown[][]> = {};
  workbook.eachSheet((sheet) => {
    const rows: unknown[][] = [];
    sheet.eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
    out[sheet.name] = rows;
  });
  return out;
}
