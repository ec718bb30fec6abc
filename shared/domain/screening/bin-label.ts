import type { LabelElement } from '../labels/index.ts';
import { ScreeningInputError } from './errors.ts';

/**
 * The hFE interval of a bin in words, with the half-open convention spelled out: "100 ≤ hFE <
 * 150", or "200 ≤ hFE ≤ 300" for the scheme's last bin (closed). Values as stored (no unit).
 */
export function binIntervalText(bin: { hfeMin: number; hfeMax: number }, isLast: boolean): string {
  return `${fmt(bin.hfeMin)} ≤ hFE ${isLast ? '≤' : '<'} ${fmt(bin.hfeMax)}`;
}

function fmt(v: number): string {
  return Number.isInteger(v) ? String(v) : String(Number(v.toFixed(3)));
}

export interface BinLabelData {
  /** Our part number (DI P). */
  partNumber: string;
  /** Our container code, the traceability code of the label (DI T). */
  containerCode: string;
  /** The supplier's lot (DI 1T); left out when unknown. */
  supplierLot: string | null;
  /** Parts in the container (DI Q). */
  quantity: number;
}

/**
 * The MH10.8.2 data elements of a bin label's Data Matrix (reference.md §3): P our part number,
 * T our traceability code (the container code, which leads to the lot and the bin), 1T the
 * supplier lot when known, Q the quantity in pieces. Pass them to `formatLabel` for the
 * ISO/IEC 15434 format-06 message.
 * @throws ScreeningInputError for a negative or fractional quantity or an empty code.
 */
export function binLabelElements(d: BinLabelData): LabelElement[] {
  if (!Number.isInteger(d.quantity) || d.quantity < 0) throw new ScreeningInputError('quantity', 'quantity must be a whole number ≥ 0');
  if (!d.partNumber.trim()) throw new ScreeningInputError('partNumber', 'partNumber must not be empty');
  if (!d.containerCode.trim()) throw new ScreeningInputError('containerCode', 'containerCode must not be empty');
  const elements: LabelElement[] = [
    { di: 'P', value: d.partNumber.trim() },
    { di: 'T', value: d.containerCode.trim() },
  ];
  const lot = d.supplierLot?.trim();
  if (lot) elements.push({ di: '1T', value: lot });
  elements.push({ di: 'Q', value: String(d.quantity) });
  return elements;
}

/** Where one label of a print job goes: the page (0-based) and the cell on it (0-based). */
export interface LabelSlot {
  page: number;
  cell: number;
}

/**
 * Places `count` labels on a stock with `cellsPerPage` cells (1 for a roll), starting at cell
 * `startPosition` (1-based) of the first page, so a half-used sheet can be used up: the cells
 * before it are skipped; later pages start at their first cell.
 * @throws ScreeningInputError (field `startPosition`) outside 1…cellsPerPage.
 */
export function labelSlots(count: number, cellsPerPage: number, startPosition = 1): LabelSlot[] {
  if (!Number.isInteger(cellsPerPage) || cellsPerPage < 1) throw new ScreeningInputError('cellsPerPage', 'cellsPerPage must be a whole number ≥ 1');
  if (!Number.isInteger(startPosition) || startPosition < 1 || startPosition > cellsPerPage) {
    throw new ScreeningInputError('startPosition', `startPosition must be a whole number from 1 to ${cellsPerPage}`);
  }
  const slots: LabelSlot[] = [];
  for (let i = 0; i < count; i++) {
    const k = startPosition - 1 + i;
    slots.push({ page: Math.floor(k / cellsPerPage), cell: k % cellsPerPage });
  }
  return slots;
}
