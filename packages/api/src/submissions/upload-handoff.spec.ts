import { UploadHandoff } from './upload-handoff.js';

const bytes = (n: number, fill = 1) => Buffer.alloc(n, fill);

describe('UploadHandoff', () => {
  it('hands the stored parts over once, joined in order', () => {
    const handoff = new UploadHandoff(100, 60_000);
    const kept = handoff.collector();
    kept.add(Buffer.from('abc'));
    kept.add(Buffer.from('def'));
    kept.commit(7);
    kept.close();
    expect(handoff.heldBytes).toBe(6);
    expect(handoff.take(7)?.toString()).toBe('abcdef');
    expect(handoff.take(7)).toBeNull();
    expect(handoff.heldBytes).toBe(0);
  });

  it('keeps nothing of an upload that outgrows the room, and gives its room back', () => {
    const handoff = new UploadHandoff(10, 60_000);
    const kept = handoff.collector();
    kept.add(bytes(6));
    expect(handoff.heldBytes).toBe(6);
    kept.add(bytes(6));
    expect(handoff.heldBytes).toBe(0);
    kept.add(bytes(1)); // stopped keeping: later parts are not taken either
    kept.commit(1);
    kept.close();
    expect(handoff.take(1)).toBeNull();
    expect(handoff.heldBytes).toBe(0);
  });

  it('counts uploads still arriving against the room', () => {
    const handoff = new UploadHandoff(10, 60_000);
    const first = handoff.collector();
    const second = handoff.collector();
    first.add(bytes(8));
    second.add(bytes(4)); // 8 + 4 > 10
    second.commit(2);
    first.commit(1);
    expect(handoff.take(2)).toBeNull();
    expect(handoff.take(1)?.length).toBe(8);
  });

  it('gives the room back when the upload fails before it is committed', () => {
    const handoff = new UploadHandoff(10, 60_000);
    const kept = handoff.collector();
    kept.add(bytes(5));
    kept.close();
    expect(handoff.heldBytes).toBe(0);
    kept.commit(3); // after close: nothing
    expect(handoff.take(3)).toBeNull();
  });

  it('lets entries go after their time, so a job claimed elsewhere does not pin memory', async () => {
    const handoff = new UploadHandoff(100, 30);
    const kept = handoff.collector();
    kept.add(bytes(10));
    kept.commit(4);
    expect(handoff.heldBytes).toBe(10);
    await new Promise((resolve) => setTimeout(resolve, 80));
    expect(handoff.heldBytes).toBe(0);
    expect(handoff.take(4)).toBeNull();
  });

  it('keeps nothing when disabled (a process that runs no jobs)', () => {
    const handoff = new UploadHandoff(100, 60_000);
    const kept = handoff.collector(false);
    kept.add(bytes(10));
    kept.commit(5);
    expect(handoff.heldBytes).toBe(0);
    expect(handoff.take(5)).toBeNull();
  });
});
