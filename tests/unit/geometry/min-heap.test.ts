/**
 * The binary min-heap of the Dijkstra searches (core/geometry/min-heap.ts), checked against a
 * general-purpose reference: popping everything gives the keys in the order Array.prototype.sort
 * gives them (heapsort; Williams 1964, "Algorithm 232: Heapsort", Communications of the ACM 7(6)),
 * and interleaved pushes and pops always return the smallest key present.
 */
import { describe, expect, it } from 'vitest';
import { MinHeap } from '../../../core/geometry/min-heap';
import { mulberry32 } from '../../../core/geometry/seeded-random';

describe('MinHeap', () => {
  it('pops all keys in ascending order, each with its own item', () => {
    const rand = mulberry32(7);
    const keys = Array.from({ length: 1000 }, () => Math.round(rand() * 200) / 8);
    const heap = new MinHeap();
    keys.forEach((k, i) => heap.push(i, k));
    const popped: number[] = [];
    while (heap.size) {
      const item = heap.pop();
      expect(keys[item]).toBe(heap.lastKey);
      popped.push(heap.lastKey);
    }
    expect(popped).toEqual([...keys].sort((a, b) => a - b));
  });

  it('interleaved with pushes, always pops the smallest key present (checked against a plain list)', () => {
    const rand = mulberry32(11);
    const heap = new MinHeap();
    const present: number[] = [];
    for (let step = 0; step < 5000; step++) {
      if (present.length === 0 || rand() < 0.55) {
        const k = rand() * 100;
        heap.push(step, k);
        present.push(k);
      } else {
        heap.pop();
        const least = Math.min(...present);
        expect(heap.lastKey).toBe(least);
        present.splice(present.indexOf(least), 1);
      }
      expect(heap.size).toBe(present.length);
    }
  });

  it('is empty again after clear()', () => {
    const heap = new MinHeap();
    heap.push(1, 3);
    heap.push(2, 1);
    heap.clear();
    expect(heap.size).toBe(0);
    heap.push(5, 2);
    expect(heap.pop()).toBe(5);
  });
});
