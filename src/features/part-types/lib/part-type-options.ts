import { MSL_CHOICES, POLARITIES, type MslChoice } from '../../../../shared/api/catalog.ts';
import { ESD_HBM_CLASSES, describeEsdClass } from '../../../../shared/domain/esd/index.ts';
import { MSL_FLOOR_LIFE } from '../../../../shared/domain/moisture/index.ts';
import { INSPECTION_LEVELS, SAMPLING_METHODS, SAMPLING_METHOD_LABELS, aqlsForMethod, type SamplingMethod } from '../../../../shared/domain/sampling/index.ts';

export function mslLabel(msl: MslChoice): string {
  if (msl === 'not-classified') return 'Not classified';
  return `MSL ${msl.toUpperCase()}`;
}

/** MSL with its J-STD-033 floor life, e.g. "MSL 3 — floor life 168 hours". */
export function mslDescription(msl: MslChoice): string {
  if (msl === 'not-classified') return 'Not classified (usual for through-hole parts)';
  return `${mslLabel(msl)} — floor life ${MSL_FLOOR_LIFE[msl].description}`;
}

export function esdDescription(id: string | null): string {
  if (id === null) return 'Unknown';
  const c = ESD_HBM_CLASSES.find((e) => e.id === id);
  return c ? `HBM class ${c.id} (${describeEsdClass(c)})` : id;
}

export const POLARITY_OPTIONS = POLARITIES.map((p) => ({ value: p, label: p }));
export const MSL_OPTIONS = MSL_CHOICES.map((m) => ({ value: m, label: mslDescription(m) }));
export const ESD_OPTIONS = [{ value: '', label: 'Unknown' }, ...ESD_HBM_CLASSES.map((c) => ({ value: c.id, label: esdDescription(c.id) }))];
export const METHOD_OPTIONS = SAMPLING_METHODS.map((m) => ({ value: m, label: SAMPLING_METHOD_LABELS[m] }));
export const LEVEL_OPTIONS = INSPECTION_LEVELS.map((l) => ({ value: l, label: l.startsWith('S') ? `${l} (special)` : `${l} (general)` }));
export const aqlOptions = (method: SamplingMethod) => aqlsForMethod(method).map((a) => ({ value: String(a), label: `${a} %` }));
