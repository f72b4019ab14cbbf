/**
 * A binary min-heap of cell indices keyed by a number (an elevation in metres), stored in two
 * parallel typed arrays so that pushing and popping allocate nothing per cell. The heap grows by
 * doubling when full. Ties between equal keys come out in no particular order.
 *
 * Method: the implicit binary heap (Williams 1964, "Algorithm 232: Heapsort", Communications of
 * the ACM 7(6):347–348), sifting with a moving hole instead of swaps.
 */
export class CellPriorityQueue {
  private keys: Float64Array;
  private cells: Int32Array;
  private count = 0;

  /**
   * @param initialCapacity - number of entries held before the first growth (at least 1)
   */
  constructor(initialCapacity = 1024) {
    const capacity = Math.max(1, Math.floor(initialCapacity));
    this.keys = new Float64Array(capacity);
    this.cells = new Int32Array(capacity);
  }

  /** Number of entries in the queue. */
  get size(): number {
    return this.count;
  }

  /**
   * Adds a cell.
   *
   * @param cell - cell index (row-major), a non-negative integer below 2^31
   * @param key - its priority, lower first; must not be NaN
   */
  push(cell: number, key: number): void {
    if (this.count === this.keys.length) this.grow();
    const keys = this.keys;
    const cells = this.cells;
    let hole = this.count++;
    // Move the hole up while the parent is larger, then drop the entry into it.
    while (hole > 0) {
      const parent = (hole - 1) >> 1;
      const parentKey = keys[parent]!;
      if (parentKey <= key) break;
      keys[hole] = parentKey;
      cells[hole] = cells[parent]!;
      hole = parent;
    }
    keys[hole] = key;
    cells[hole] = cell;
  }

  /**
   * Removes and returns the cell with the lowest key.
   *
   * @returns the cell index, or -1 when the queue is empty
   */
  pop(): number {
    if (this.count === 0) return -1;
    const keys = this.keys;
    const cells = this.cells;
    const top = cells[0]!;
    const last = --this.count;
    if (last === 0) return top;
    const key = keys[last]!;
    const cell = cells[last]!;
    let hole = 0;
    // Move the hole down towards the smaller child while that child is smaller than the last entry.
    for (;;) {
      let child = 2 * hole + 1;
      if (child >= last) break;
      let childKey = keys[child]!;
      const right = child + 1;
      if (right < last) {
        const rightKey = keys[right]!;
        if (rightKey < childKey) {
          child = right;
          childKey = rightKey;
        }
      }
      if (childKey >= key) break;
      keys[hole] = childKey;
      cells[hole] = cells[child]!;
      hole = child;
    }
    keys[hole] = key;
    cells[hole] = cell;
    return top;
  }

  private grow(): void {
    const keys = new Float64Array(this.keys.length * 2);
    const cells = new Int32Array(this.cells.length * 2);
    keys.set(this.keys);
    cells.set(this.cells);
    this.keys = keys;
    this.cells = cells;
  }
}
