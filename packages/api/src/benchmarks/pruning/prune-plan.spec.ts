import type { StoredResultInfo } from '../benchmark-results.repository.js';
import { currentResultIds, resultsToRemove } from './prune-plan.js';

const DAY = 86_400;
const row = (id: number, quarterId: number, key: string, ageSeconds: number): StoredResultInfo => ({
  id,
  quarterId,
  submissionsKey: key,
  ageSeconds,
});

describe('resultsToRemove', () => {
  const retention = { keepNewest: 2, graceMinutes: 60 };

  it.each<[string, StoredResultInfo[], [number, string][], number[]]>([
    ['nothing stored', [], [], []],
    [
      'the newest two of a quarter kept, older sets removed',
      [row(1, 7, 'a', DAY), row(2, 7, 'b', DAY), row(3, 7, 'c', DAY), row(4, 7, 'd', DAY)],
      [[7, 'd']],
      [1, 2],
    ],
    [
      'the current set’s result kept however old',
      [row(1, 7, 'a', DAY), row(2, 7, 'b', DAY), row(3, 7, 'c', DAY), row(4, 7, 'd', DAY)],
      [[7, 'a']],
      [2],
    ],
    [
      'every result of the current set kept (another measure set or format)',
      [row(1, 7, 'a', DAY), row(2, 7, 'a', DAY), row(3, 7, 'c', DAY), row(4, 7, 'd', DAY)],
      [[7, 'a']],
      [],
    ],
    [
      'a result built within the grace minutes kept',
      [row(1, 7, 'a', 59 * 60), row(2, 7, 'b', 60 * 60), row(3, 7, 'c', DAY), row(4, 7, 'd', DAY)],
      [[7, 'd']],
      [2],
    ],
    [
      'each quarter counted apart',
      [row(1, 7, 'a', DAY), row(2, 8, 'x', DAY), row(3, 7, 'b', DAY), row(4, 8, 'y', DAY)],
      [
        [7, 'b'],
        [8, 'y'],
      ],
      [],
    ],
    [
      'a quarter without a current set keeps its newest only',
      [row(5, 9, 'a', DAY), row(6, 9, 'b', DAY), row(9, 9, 'c', DAY)],
      [],
      [5],
    ],
    [
      'newest by id, not by the order read',
      [row(9, 7, 'c', DAY), row(2, 7, 'a', DAY), row(5, 7, 'b', DAY)],
      [[7, 'z']],
      [2],
    ],
  ])('%s', (_case, rows, current, removed) => {
    expect(resultsToRemove(rows, new Map(current), retention)).toEqual(removed);
  });

  it('keeps the newest one when asked to keep one', () => {
    const rows = [row(1, 7, 'a', DAY), row(2, 7, 'b', DAY)];
    expect(resultsToRemove(rows, new Map(), { keepNewest: 1, graceMinutes: 1 })).toEqual([1]);
  });
});

describe('currentResultIds', () => {
  it('gives each quarter the ids of its current set’s results', () => {
    const rows = [row(1, 7, 'a', 0), row(2, 7, 'b', 0), row(3, 7, 'b', 0), row(4, 8, 'x', 0)];
    expect(
      currentResultIds(
        rows,
        new Map([
          [7, 'b'],
          [9, 'q'],
        ]),
      ),
    ).toEqual(new Map([[7, [2, 3]]]));
  });
});
