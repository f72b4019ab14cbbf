import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CellPriorityQueue } from '../../../src/lib/terrain/priority-queue';

describe('CellPriorityQueue', () => {
  it('pops the lowest key first and -1 when empty', () => {
    const queue = new CellPriorityQueue(1);
    queue.push(10, 3.5);
    queue.push(11, -1);
    queue.push(12, 2);
    expect(queue.size).toBe(3);
    expect([queue.pop(), queue.pop(), queue.pop(), queue.pop()]).toEqual([11, 12, 10, -1]);
    expect(queue.size).toBe(0);
  });

  it('returns keys in non-decreasing order for any pushes and pops (grows past its capacity)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), fc.constant('pop' as const)), {
          maxLength: 300,
        }),
        (operations) => {
          const queue = new CellPriorityQueue(2);
          const keyOf: number[] = [];
          const reference: number[] = [];
          for (const op of operations) {
            if (op === 'pop') {
              const cell = queue.pop();
              if (reference.length === 0) {
                expect(cell).toBe(-1);
                continue;
              }
              reference.sort((a, b) => a - b);
              // Compared with === so that equal keys 0 and −0 may come out in either order.
              expect(keyOf[cell] === reference.shift()).toBe(true);
            } else {
              keyOf.push(op);
              reference.push(op);
              queue.push(keyOf.length - 1, op);
            }
            expect(queue.size).toBe(reference.length);
          }
        },
      ),
    );
  });
});
