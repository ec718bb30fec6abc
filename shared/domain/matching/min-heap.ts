import { scratchFloat64, scratchInt32 } from './buffers.ts';

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

/**
 * Binary min-heap holding at most one entry per id (0 … capacity − 1): setting an id that is
 * already in the heap moves its entry to the new key. Keeps the heap as small as the set of
 * pending events, instead of one stale entry per superseded key.
 */
export class IndexedMinHeap {
  private readonly keys: Float64Array;
  private readonly ids: Int32Array;
  /** Heap position of each id, or −1. */
  private readonly pos: Int32Array;
  private count = 0;

  /** With a scratch key, the arrays are buffers kept between runs (buffers.ts). */
  constructor(capacity: number, scratchKey?: string) {
    if (scratchKey === undefined) {
      this.keys = new Float64Array(capacity);
      this.ids = new Int32Array(capacity);
      this.pos = new Int32Array(capacity);
    } else {
      this.keys = scratchFloat64(`${scratchKey}.keys`, capacity);
      this.ids = scratchInt32(`${scratchKey}.ids`, capacity);
      this.pos = scratchInt32(`${scratchKey}.pos`, capacity);
    }
    this.pos.fill(-1);
  }

  get size(): number {
    return this.count;
  }

  get topKey(): number {
    return this.keys[0] as number;
  }

  get topId(): number {
    return this.ids[0] as number;
  }

  /** Inserts id with key, or gives the id's entry the new key. */
  set(key: number, id: number): void {
    const at = this.pos[id] as number;
    if (at === -1) {
      this.siftUp(this.count++, key, id);
    } else if (key < (this.keys[at] as number)) {
      this.siftUp(at, key, id);
    } else {
      this.siftDown(at, key, id, this.count);
    }
  }

  /** Removes the smallest entry. */
  pop(): void {
    if (this.count === 0) return;
    this.pos[this.ids[0] as number] = -1;
    const size = --this.count;
    if (size > 0) this.siftDown(0, this.keys[size] as number, this.ids[size] as number, size);
  }

  private siftUp(start: number, key: number, id: number): void {
    const { keys, ids, pos } = this;
    let i = start;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if ((keys[parent] as number) <= key) break;
      keys[i] = keys[parent] as number;
      ids[i] = ids[parent] as number;
      pos[ids[i] as number] = i;
      i = parent;
    }
    keys[i] = key;
    ids[i] = id;
    pos[id] = i;
  }

  private siftDown(start: number, key: number, id: number, size: number): void {
    const { keys, ids, pos } = this;
    let i = start;
    for (;;) {
      const l = 2 * i + 1;
      if (l >= size) break;
      const r = l + 1;
      const child = r < size && (keys[r] as number) < (keys[l] as number) ? r : l;
      if ((keys[child] as number) >= key) break;
      keys[i] = keys[child] as number;
      ids[i] = ids[child] as number;
      pos[ids[i] as number] = i;
      i = child;
    }
    keys[i] = key;
    ids[i] = id;
    pos[id] = i;
  }
}
