import type { GainBinInput } from '../../../../shared/api/catalog.ts';
import type { FieldError } from '../../../../shared/api/problem.ts';
import { validateBinScheme, type PartHfeLimits } from '../../../../shared/domain/binning/index.ts';

/** One editable row of the scheme editor: numbers stay text until saved, so typing is never lost. */
export interface BinDraft {
  key: string;
  code: string;
  label: string;
  hfeMin: string;
  hfeMax: string;
  vbeMinMv: string;
  vbeMaxMv: string;
  gapBeforeIntended: boolean;
}

export type BinDraftField = Exclude<keyof BinDraft, 'key'>;

let nextKey = 0;
const newKey = () => `bin-${++nextKey}`;

const text = (n: number | null | undefined) => (n === null || n === undefined ? '' : String(n));

export function draftsFromBins(bins: readonly GainBinInput[]): BinDraft[] {
  return bins.map((b) => ({
    key: newKey(),
    code: b.code,
    label: b.label,
    hfeMin: text(b.hfeMin),
    hfeMax: text(b.hfeMax),
    vbeMinMv: text(b.vbeMinMv),
    vbeMaxMv: text(b.vbeMaxMv),
    gapBeforeIntended: b.gapBeforeIntended ?? false,
  }));
}

/** A new row that starts where the previous one ends (no gap). */
export function nextDraft(previous: BinDraft | undefined): BinDraft {
  return { key: newKey(), code: '', label: '', hfeMin: previous?.hfeMax ?? '', hfeMax: '', vbeMinMv: '', vbeMaxMv: '', gapBeforeIntended: false };
}

/** '' → null (open); anything that is not a number → NaN, which validation then names. */
export function parseNumber(value: string): number | null {
  const t = value.trim().replace(',', '.');
  if (t === '') return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : NaN;
}

/** The rows as the API and validateBinScheme take them. A blank hFE end becomes NaN so it is reported. */
export function draftsToBins(drafts: readonly BinDraft[]): GainBinInput[] {
  return drafts.map((d) => ({
    code: d.code.trim(),
    label: d.label.trim(),
    hfeMin: parseNumber(d.hfeMin) ?? NaN,
    hfeMax: parseNumber(d.hfeMax) ?? NaN,
    vbeMinMv: parseNumber(d.vbeMinMv),
    vbeMaxMv: parseNumber(d.vbeMaxMv),
    gapBeforeIntended: d.gapBeforeIntended,
  }));
}

export interface SchemeProblems {
  /** Messages per row index and field. */
  rows: Map<number, Partial<Record<BinDraftField, string>>>;
  /** Messages about the scheme as a whole. */
  scheme: string[];
  count: number;
}

const BIN_FIELD = /^bins\[(\d+)\]\.(\w+)$/;

/**
 * Problems to show in the editor: the shared validateBinScheme preview (the same rules the
 * server applies) plus any field errors the server answered with (`bins[i].field`).
 */
export function schemeProblems(drafts: readonly BinDraft[], limits: PartHfeLimits, serverErrors: readonly FieldError[] = []): SchemeProblems {
  const rows = new Map<number, Partial<Record<BinDraftField, string>>>();
  const scheme: string[] = [];
  let count = 0;
  const add = (index: number, field: string, message: string) => {
    count++;
    if (index < 0) {
      scheme.push(message);
      return;
    }
    const row = rows.get(index) ?? {};
    const key = field as BinDraftField;
    if (!row[key]) row[key] = message;
    rows.set(index, row);
  };
  for (const e of validateBinScheme(draftsToBins(drafts), limits).errors) add(e.index, e.field, e.message);
  for (const e of serverErrors) {
    const m = BIN_FIELD.exec(e.field);
    if (m) add(Number(m[1]), m[2], e.message);
    else if (e.field === 'bins' || e.field === 'note') add(-1, e.field, e.message);
  }
  return { rows, scheme, count };
}
