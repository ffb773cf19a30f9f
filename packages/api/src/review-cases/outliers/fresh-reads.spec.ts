import { FreshReads } from './outlier-source.js';

/** A read whose answer is given by the test, and when it began. */
function manualReads() {
  const began: number[] = [];
  const finish: ((v: number) => void)[] = [];
  const fn = () =>
    new Promise<number>((resolve) => {
      began.push(began.length + 1);
      finish.push(resolve);
    });
  return { began, finish, fn };
}

describe('FreshReads', () => {
  it('gives a caller that comes during a read the next read, shared with later callers', async () => {
    const reads = new FreshReads<number>();
    const m = manualReads();
    const first = reads.read('q', m.fn);
    const second = reads.read('q', m.fn);
    const third = reads.read('q', m.fn);
    expect(m.began).toEqual([1]);
    m.finish[0]!(10);
    expect(await first).toBe(10);
    await Promise.resolve();
    expect(m.began).toEqual([1, 2]);
    m.finish[1]!(20);
    expect([await second, await third]).toEqual([20, 20]);
  });

  it('keeps keys apart and starts again after a failed read', async () => {
    const reads = new FreshReads<number>();
    const failing = reads.read('a', () => Promise.reject(new Error('gone')));
    const after = reads.read('a', () => Promise.resolve(2));
    const other = reads.read('b', () => Promise.resolve(3));
    await expect(failing).rejects.toThrow('gone');
    expect([await after, await other]).toEqual([2, 3]);
  });
});
