import { describe, expect, it } from 'vitest';
import { AckQueue } from './ackQueue';

describe('AckQueue', () => {
  it('sends nothing before commit and then in arrival order', () => {
    const sent: number[] = [];
    const q = new AckQueue();
    for (const id of [1, 2, 3]) q.arrived(id);
    for (const id of [1, 2, 3]) expect(q.hold(id, () => sent.push(id))).toBe(true);
    q.committed(3);
    q.committed(2);
    expect(sent).toEqual([]);
    q.committed(1);
    expect(sent).toEqual([1, 2, 3]);
    expect(q.waiting).toBe(0);
  });

  it('handles a commit that comes before the client asks to acknowledge', () => {
    const sent: number[] = [];
    const q = new AckQueue();
    q.arrived(7);
    q.committed(7);
    expect(sent).toEqual([]);
    q.hold(7, () => sent.push(7));
    expect(sent).toEqual([7]);
  });

  it('lets through acknowledgements it does not hold', () => {
    expect(new AckQueue().hold(42, () => {})).toBe(false);
  });

  it('keeps a reused message id apart from the earlier message', () => {
    const sent: string[] = [];
    const q = new AckQueue();
    q.arrived(5);
    q.hold(5, () => sent.push('first'));
    q.committed(5);
    q.arrived(5);
    q.hold(5, () => sent.push('second'));
    expect(sent).toEqual(['first']);
    q.committed(5);
    expect(sent).toEqual(['first', 'second']);
  });
});

describe('AckQueue with many messages', () => {
  it('releases 5,000 acknowledgements in arrival order whatever the commit order', () => {
    const sent: number[] = [];
    const q = new AckQueue();
    const ids = Array.from({ length: 5000 }, (_, i) => (i % 65535) + 1);
    for (const id of ids) q.arrived(id);
    for (const id of ids) q.hold(id, () => sent.push(id));
    // Commit in a scrambled but complete order (a fixed permutation).
    const order = ids.map((_, i) => (i * 7919) % ids.length);
    for (const i of order) q.committed(ids[i]!);
    expect(sent).toEqual(ids);
    expect(q.waiting).toBe(0);
  });
});
