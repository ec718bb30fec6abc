/** Binary min-heap of (key, id) pairs in typed arrays; stale entries are the caller's to skip (lazy deletion). */
export class MinHeap {
  private keys = new Float64Array(64);
  private ids = new Int32Array(64);
  private count = 0;

  get size(): number {
    return this.count;
  }

  /** Key and id of the smallest entry; only valid when size > 0. */
  get topKey(): number {
    return this.keys[0] as number;
  }

  get topId(): number {
    return this.ids[0] as number;
  }

  clear(): void {
    this.count = 0;
  }

  push(key: number, id: number): void {
    if (this.count === this.keys.length) {
      const keys = new Float64Array(2 * this.count);
      keys.set(this.keys);
      this.keys = keys;
      const ids = new Int32Array(2 * this.count);
      ids.set(this.ids);
      this.ids = ids;
    }
    const keys = this.keys;
    const ids = this.ids;
    let i = this.count++;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if ((keys[parent] as number) <= key) break;
      keys[i] = keys[parent] as number;
      ids[i] = ids[parent] as number;
      i = parent;
    }
    keys[i] = key;
    ids[i] = id;
  }

  /** Removes the smallest entry. */
  pop(): void {
    const keys = this.keys;
    const ids = this.ids;
    const size = --this.count;
    if (size <= 0) {
      this.count = Math.max(0, size);
      return;
    }
    const lastKey = keys[size] as number;
    const lastId = ids[size] as number;
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      if (l >= size) break;
      const r = l + 1;
      const child = r < size && (keys[r] as number) < (keys[l] as number) ? r : l;
      if ((keys[child] as number) >= lastKey) break;
      keys[i] = keys[child] as number;
      ids[i] = ids[child] as number;
      i = child;
    }
    keys[i] = lastKey;
    ids[i] = lastId;
  }
}
