/**
 * PracticeResultsService.resultsWithDetail: the results and their detail, two stored answers,
 * combined only when both were built from the same stored result; read again when a confirm
 * came between the two reads, a 409 problem when they still differ.
 */
import { jest } from '@jest/globals';
import { systemActor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { PracticeResultsDetailDto, PracticeResultsDto } from './dto/practice-results.dto.js';
import { PracticeResultsService } from './practice-results.service.js';

const builtFrom = (resultId: number) =>
  ({ resultId }) as unknown as NonNullable<PracticeResultsDto['builtFrom']>;
const results = (resultId: number | null) =>
  ({
    practice: { id: 2, code: 'OV102', name: 'x', localityName: null },
    quarter: { id: 8, label: '2026 Q3' },
    builtFrom: resultId === null ? null : builtFrom(resultId),
    measures: [],
  }) as unknown as PracticeResultsDto;
const detail = (resultId: number | null, marker: string) =>
  ({
    builtFrom: resultId === null ? null : builtFrom(resultId),
    detail: resultId === null ? null : { marker },
  }) as unknown as PracticeResultsDetailDto;

function service(resultIds: (number | null)[], detailIds: (number | null)[]) {
  // Only results() and detail() are used: the stored answers' readers, given here in turn.
  const s = Object.create(PracticeResultsService.prototype) as PracticeResultsService;
  let r = 0;
  let d = 0;
  const readResults = jest.fn(async () => results(resultIds[Math.min(r++, resultIds.length - 1)]!));
  const readDetail = jest.fn(async () => {
    const id = detailIds[Math.min(d, detailIds.length - 1)]!;
    return detail(id, `read ${d++}`);
  });
  Object.assign(s, { results: readResults, detail: readDetail });
  return { s, readResults, readDetail };
}

const actor = systemActor('publishing', 1);

describe('resultsWithDetail', () => {
  it('combines the results with the detail built from the same stored result', async () => {
    const { s, readDetail } = service([7], [7]);
    const both = await s.resultsWithDetail(actor, 2, 8);
    expect(both.builtFrom).toEqual(builtFrom(7));
    expect(both.detail).toEqual({ marker: 'read 0' });
    expect(readDetail).toHaveBeenCalledTimes(1);
  });

  it('gives no detail with no current submission (neither part built from a result)', async () => {
    const { s } = service([null], [null]);
    expect((await s.resultsWithDetail(actor, 2, 8)).detail).toBeNull();
  });

  it('reads both again when a confirm came between them, and combines the matching pair', async () => {
    // Results of result 7, then the detail of result 8 (a confirm in between); then both of 8.
    const { s, readResults } = service([7, 8], [8, 8]);
    const both = await s.resultsWithDetail(actor, 2, 8);
    expect(readResults).toHaveBeenCalledTimes(2);
    expect(both.builtFrom).toEqual(builtFrom(8));
    expect(both.detail).toEqual({ marker: 'read 1' });
  });

  it('answers 409 naming the quarter when the parts still differ after three reads', async () => {
    const { s, readResults } = service([7, 8, 9], [8, 9, 10]);
    const error = await s.resultsWithDetail(actor, 2, 8).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ProblemException);
    const problem = (error as ProblemException).toProblem();
    expect(problem).toMatchObject({ status: 409, type: '/api/problems/results-changed' });
    expect(problem.detail).toMatch(/2026 Q3/);
    expect(readResults).toHaveBeenCalledTimes(3);
  });
});
