/** received → inspecting → awaiting-signature → accepted | rejected | mrb */
export type LotStatus = 'received' | 'inspecting' | 'awaiting-signature' | 'accepted' | 'rejected' | 'mrb';

export const BENCH_QUEUE_STATUSES = ['received', 'inspecting', 'awaiting-signature'] as const;

/** One row of GET /api/bench/queue. */
export interface BenchQueueRow {
  id: number;
  code: string;
  status: LotStatus;
  quantity: number;
  partNumber: string;
  supplierName: string;
  receivedAt: string;
  measured: number;
}

export type BenchQueueSort = 'receivedAt' | 'code' | 'status' | 'quantity';
