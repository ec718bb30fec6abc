/** Binary min-heap of (key, id) pairs; stale entries are the caller's to skip (lazy deletion). */
export class MinHeap {
  private keys: number[] = [];
  private ids: number[] = [];

  get size(): number {
    return this.keys.length;
  }

  /** Key and id of the smallest entry; only valid when size > 0. */
  get topKey(): number {
    return this.keys[0] as number;
  }

  get topId(): number {
    return this.ids[0] as number;
  }

  clear(): void {
    this.keys.length = 0;
    this.ids.length = 0;
  }

  push(key: number, id: number): void {
    const keys = this.keys;
    const ids = this.ids;
    let i = keys.length;
    keys.push(key);
    ids.push(id);
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
    const lastKey = keys.pop() as number;
    const lastId = ids.pop() as number;
    const size = keys.length;
    if (size === 0) return;
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
