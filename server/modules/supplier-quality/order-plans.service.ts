import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { OrderPlanJob, OrderPlanRequest } from '../../../shared/api/supplier-quality.ts';
import type { GainBin } from '../../../shared/domain/binning/index.ts';
import { mulberry32, orderPlanSteps, PlanningInputError, type PlanPart } from '../../../shared/domain/planning/index.ts';
import { AppError } from '../../http/app-error.ts';
import { planMatcher } from './plan-matcher.ts';

/**
 * Order-quantity plans run as jobs in this process: POST starts one and answers its id at once,
 * GET polls its progress and, when done, its result. The simulation runs on the main thread in
 * slices of about 40 ms with a yield to the event loop between them, so the server keeps answering
 * while it runs. Jobs live in memory only (a restart forgets them; the same seed reproduces a
 * result), are kept for an hour, and at most MAX_RUNNING run at once per process.
 */
const jobs = new Map<string, OrderPlanJob & { startedMs: number }>();
const KEEP_MS = 60 * 60_000;
const MAX_RUNNING = 3;
const SLICE_MS = 40;
/** The bootstrap pool: the newest readings of accepted lots, at most this many. */
const MAX_HISTORY = 5000;

function prune(now = Date.now()) {
  for (const [id, j] of jobs) if (j.status !== 'running' && now - j.startedMs > KEEP_MS) jobs.delete(id);
}

const pause = () => new Promise<void>((resolve) => setImmediate(resolve));

async function loadInputs(ds: DataSource, req: OrderPlanRequest): Promise<{ history: PlanPart[]; lots: number; bins: GainBin[] }> {
  const [pair] = (await ds.query(
    `SELECT (SELECT count(*)::int FROM supplier WHERE id = $1) AS s, (SELECT count(*)::int FROM part_type WHERE id = $2) AS p`,
    [req.supplierId, req.partTypeId],
  )) as { s: number; p: number }[];
  const errors = [];
  if (!pair.s) errors.push({ field: 'supplierId', message: `no supplier ${req.supplierId}` });
  if (!pair.p) errors.push({ field: 'partTypeId', message: `no part type ${req.partTypeId}` });
  if (errors.length) throw AppError.unprocessable('Check the supplier and part type.', errors);
  const rows = (await ds.query(
    `SELECT m.hfe_25, m.vbe_mv_25, m.lot_id
       FROM measurement m JOIN lot l ON l.id = m.lot_id
      WHERE l.supplier_id = $1 AND l.part_type_id = $2 AND l.status = 'accepted' AND NOT m.superseded
      ORDER BY l.received_at DESC, m.id DESC LIMIT $3`,
    [req.supplierId, req.partTypeId, MAX_HISTORY],
  )) as { hfe_25: number; vbe_mv_25: number; lot_id: number }[];
  const bins = (await ds.query(
    `SELECT b.code, b.label, b.hfe_min AS "hfeMin", b.hfe_max AS "hfeMax", b.vbe_min_mv AS "vbeMinMv", b.vbe_max_mv AS "vbeMaxMv"
       FROM gain_bin b WHERE b.scheme_id = (SELECT id FROM gain_bin_scheme WHERE part_type_id = $1 ORDER BY version DESC LIMIT 1)
      ORDER BY b.position`,
    [req.partTypeId],
  )) as GainBin[];
  return { history: rows.map((r) => ({ hfe: r.hfe_25, vbeMv: r.vbe_mv_25 })), lots: new Set(rows.map((r) => r.lot_id)).size, bins };
}

function view(j: OrderPlanJob & { startedMs: number }): OrderPlanJob {
  const { startedMs, ...rest } = j;
  return { ...rest, elapsedMs: j.finishedAt ? Date.parse(j.finishedAt) - startedMs : Date.now() - startedMs };
}

/** Starts a plan: loads the supplier's measured parts and the part's gain bins, then simulates in the background. */
export async function startOrderPlan(ds: DataSource, req: OrderPlanRequest): Promise<OrderPlanJob> {
  prune();
  if ([...jobs.values()].filter((j) => j.status === 'running').length >= MAX_RUNNING) {
    throw new AppError(429, 'busy', `${MAX_RUNNING} plans are running already; try again in a few seconds.`);
  }
  const { history, lots, bins } = await loadInputs(ds, req);
  if (history.length < 20) {
    throw AppError.unprocessable(`This supplier has ${history.length} measured parts of accepted lots of the part; planning needs at least 20.`, [
      { field: 'supplierId', message: 'not enough measured history for this part' },
    ]);
  }
  const input = {
    history,
    setsWanted: req.setsWanted,
    setSize: req.setSize,
    hfeTolerancePct: req.hfeTolerancePct,
    vbeToleranceMv: req.vbeToleranceMv,
    confidence: req.confidencePct / 100,
    simulations: req.simulations ?? 200,
    bins: bins.map((b) => ({ ...b, hfeMin: Number(b.hfeMin), hfeMax: Number(b.hfeMax) })),
  };
  let steps: ReturnType<typeof orderPlanSteps>;
  try {
    steps = orderPlanSteps(input, mulberry32(req.seed ?? 1), planMatcher);
    // The generator validates on its first step; run it now so bad input answers 422 here.
    const first = steps.next();
    if (first.done) throw new Error('plan finished before its first step');
    const job = {
      id: randomUUID(),
      status: 'running' as const,
      progress: first.value,
      startedAt: new Date().toISOString(),
      startedMs: Date.now(),
      finishedAt: null,
      elapsedMs: 0,
      request: req,
      history: { parts: history.length, lots },
      error: null,
      result: null,
    };
    jobs.set(job.id, job);
    void run(job.id, steps, bins);
    return view(job);
  } catch (e) {
    if (e instanceof PlanningInputError) throw AppError.unprocessable(e.message, [{ field: e.field, message: e.message }]);
    throw e;
  }
}

async function run(id: string, steps: ReturnType<typeof orderPlanSteps>, bins: GainBin[]): Promise<void> {
  const job = jobs.get(id)!;
  try {
    let sliceStart = performance.now();
    for (;;) {
      const next = steps.next();
      if (next.done) {
        const r = next.value;
        const label = (code: string | null) => (code === null ? 'Outside all bins' : (bins.find((b) => b.code === code)?.label ?? code));
        job.result = { ...r, leftovers: r.leftovers.map((l) => ({ ...l, label: label(l.code) })) };
        job.status = 'done';
        break;
      }
      job.progress = next.value;
      if (performance.now() - sliceStart > SLICE_MS) {
        await pause();
        sliceStart = performance.now();
      }
    }
  } catch (e) {
    console.error('[binwright] order plan failed', e);
    job.status = 'failed';
    job.error = e instanceof Error ? e.message : String(e);
  }
  job.finishedAt = new Date().toISOString();
}

export function getOrderPlan(id: string): OrderPlanJob {
  const j = jobs.get(id);
  if (!j) throw AppError.notFound(`Order plan ${id}`);
  return view(j);
}

/** Waits until a job has finished (tests and scripts). */
export async function waitForOrderPlan(id: string, timeoutMs = 60_000): Promise<OrderPlanJob> {
  const start = Date.now();
  for (;;) {
    const j = getOrderPlan(id);
    if (j.status !== 'running') return j;
    if (Date.now() - start > timeoutMs) throw new Error(`order plan ${id} still running after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 20));
  }
}
