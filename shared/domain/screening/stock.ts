import type { AdjustResult, ContainerStatus } from './types.ts';

/**
 * The count of a container after adding `delta` parts (negative removes): refused when the
 * delta is zero or not whole, when the count would go below zero, or above the capacity. Counts
 * never go negative (product rule, Binwright Bins).
 */
export function adjustQuantity(current: { quantity: number; capacity: number }, delta: number): AdjustResult {
  if (!Number.isInteger(delta)) return { ok: false, reason: 'not-whole', message: 'delta must be a whole number of parts' };
  if (delta === 0) return { ok: false, reason: 'zero', message: 'delta must not be zero' };
  const quantity = current.quantity + delta;
  if (quantity < 0) {
    return { ok: false, reason: 'below-zero', message: `the container holds ${current.quantity}; removing ${-delta} would leave fewer than none` };
  }
  if (quantity > current.capacity) {
    return { ok: false, reason: 'over-capacity', message: `the container takes at most ${current.capacity}; adding ${delta} to ${current.quantity} exceeds it` };
  }
  return { ok: true, quantity };
}

/**
 * A container's status after its count changed to `quantity`: at capacity it is full; an open
 * container stays open (screening may refill it) even at zero; any other container left with no
 * part is empty; an empty container that receives parts again is closed (a person put them
 * there, not screening); otherwise the status does not change — a full container that loses a
 * part stays full, so screening does not refill it.
 */
export function statusAfter(previous: ContainerStatus, quantity: number, capacity: number): ContainerStatus {
  if (quantity >= capacity) return 'full';
  if (quantity === 0) return previous === 'open' ? 'open' : 'empty';
  if (previous === 'empty') return 'closed';
  return previous;
}
