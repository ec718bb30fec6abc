/**
 * Large scratch typed arrays kept between calls. A fresh typed array of a few megabytes costs
 * page faults when first written — on the 2-vCPU bench machine about 3–4 ms per megabyte, a large
 * share of a 10 000-part matching — while refilling one that is already mapped costs a fraction
 * of that. Each use site takes its buffers under its own key; the taker must not keep the array
 * past its own return, nor take the same key again while still using it (the solvers here are
 * synchronous and never nested under the same key). Contents are NOT cleared: callers fill what
 * they read.
 */
type Kind = 'i32' | 'f64' | 'u8';
const pool = new Map<string, ArrayBuffer>();
/** Buffers above this size are not kept (a one-off giant problem should not pin its memory). */
const KEEP_LIMIT_BYTES = 16 * 1024 * 1024;

function take(key: string, bytes: number): ArrayBuffer {
  const have = pool.get(key);
  if (have !== undefined && have.byteLength >= bytes) return have;
  // Round up so a slightly larger problem next time reuses the buffer.
  const buffer = new ArrayBuffer(Math.max(64, Math.ceil((bytes * 1.25) / 8) * 8));
  if (buffer.byteLength <= KEEP_LIMIT_BYTES) pool.set(key, buffer);
  else pool.delete(key);
  return buffer;
}

const WIDTH: Record<Kind, number> = { i32: 4, f64: 8, u8: 1 };

/** An Int32Array of exactly `length` over the buffer kept under `key` (contents left as they were). */
export function scratchInt32(key: string, length: number): Int32Array {
  return new Int32Array(take(`i32:${key}`, length * WIDTH.i32), 0, length);
}

export function scratchFloat64(key: string, length: number): Float64Array {
  return new Float64Array(take(`f64:${key}`, length * WIDTH.f64), 0, length);
}

export function scratchUint8(key: string, length: number): Uint8Array {
  return new Uint8Array(take(`u8:${key}`, length * WIDTH.u8), 0, length);
}
