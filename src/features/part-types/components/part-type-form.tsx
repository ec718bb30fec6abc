import { useState, type FormEvent, type ReactNode } from 'react';
import { PART_TYPE_DEFAULTS, type MslChoice, type PartTypeInput, type PartTypeRow, type Polarity } from '../../../../shared/api/catalog.ts';
import { aqlsForMethod, type SamplingMethod } from '../../../../shared/domain/sampling/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreatePartType } from '../api/create-part-type.ts';
import { useUpdatePartType } from '../api/update-part-type.ts';
import { parseNumber } from '../lib/bin-drafts.ts';
import { ESD_OPTIONS, LEVEL_OPTIONS, METHOD_OPTIONS, MSL_OPTIONS, POLARITY_OPTIONS, aqlOptions } from '../lib/part-type-options.ts';

type NumberKey =
  | 'hfeIcMa'
  | 'hfeVceV'
  | 'vbeIcMa'
  | 'hfeMin'
  | 'hfeMax'
  | 'vbeMinMv'
  | 'vbeMaxMv'
  | 'vbeTcMvPerC'
  | 'hfeTcPctPerC'
  | 'matchHfePct'
  | 'matchVbeMv';

type FormState = Record<NumberKey | 'partNumber' | 'description' | 'packageName' | 'esdHbmClass' | 'inspectionLevel' | 'aql', string> & {
  polarity: Polarity;
  msl: MslChoice;
  samplingMethod: SamplingMethod;
  active: boolean;
};

const NULLABLE: NumberKey[] = ['hfeMin', 'hfeMax', 'vbeMinMv', 'vbeMaxMv'];
const s = (n: number | null | undefined) => (n === null || n === undefined ? '' : String(n));

const EMPTY: FormState = {
  partNumber: '',
  description: '',
  polarity: 'NPN',
  packageName: '',
  hfeIcMa: '',
  hfeVceV: '',
  vbeIcMa: '',
  hfeMin: '',
  hfeMax: '',
  vbeMinMv: '',
  vbeMaxMv: '',
  vbeTcMvPerC: s(PART_TYPE_DEFAULTS.vbeTcMvPerC),
  hfeTcPctPerC: s(PART_TYPE_DEFAULTS.hfeTcPctPerC),
  msl: 'not-classified',
  esdHbmClass: '',
  samplingMethod: PART_TYPE_DEFAULTS.samplingMethod,
  inspectionLevel: PART_TYPE_DEFAULTS.inspectionLevel,
  aql: s(PART_TYPE_DEFAULTS.aql),
  matchHfePct: s(PART_TYPE_DEFAULTS.matchHfePct),
  matchVbeMv: s(PART_TYPE_DEFAULTS.matchVbeMv),
  active: true,
};

function fromRow(p: PartTypeRow): FormState {
  return {
    partNumber: p.partNumber,
    description: p.description,
    polarity: p.polarity,
    packageName: p.packageName,
    hfeIcMa: s(p.hfeIcMa),
    hfeVceV: s(p.hfeVceV),
    vbeIcMa: s(p.vbeIcMa),
    hfeMin: s(p.hfeMin),
    hfeMax: s(p.hfeMax),
    vbeMinMv: s(p.vbeMinMv),
    vbeMaxMv: s(p.vbeMaxMv),
    vbeTcMvPerC: s(p.vbeTcMvPerC),
    hfeTcPctPerC: s(p.hfeTcPctPerC),
    msl: p.msl,
    esdHbmClass: p.esdHbmClass ?? '',
    samplingMethod: p.samplingMethod,
    inspectionLevel: p.inspectionLevel,
    aql: s(p.aql),
    matchHfePct: s(p.matchHfePct),
    matchVbeMv: s(p.matchVbeMv),
    active: p.active,
  };
}

/** Text to number: blank → null for open limits (left out for required values); unreadable text goes as typed so the server names it. */
function num(value: string, nullable: boolean): number | null | string | undefined {
  const n = parseNumber(value);
  if (n === null) return nullable ? null : undefined;
  return Number.isNaN(n) ? value : n;
}

function toBody(f: FormState): PartTypeInput {
  const numbers = Object.fromEntries(
    (['hfeIcMa', 'hfeVceV', 'vbeIcMa', 'hfeMin', 'hfeMax', 'vbeMinMv', 'vbeMaxMv', 'vbeTcMvPerC', 'hfeTcPctPerC', 'matchHfePct', 'matchVbeMv'] as NumberKey[]).map((k) => [
      k,
      num(f[k], NULLABLE.includes(k)),
    ]),
  );
  return {
    partNumber: f.partNumber,
    description: f.description,
    polarity: f.polarity,
    packageName: f.packageName,
    ...numbers,
    msl: f.msl,
    esdHbmClass: f.esdHbmClass || null,
    samplingMethod: f.samplingMethod,
    inspectionLevel: f.inspectionLevel,
    aql: Number(f.aql),
    active: f.active,
  } as PartTypeInput;
}

function Group({ legend, hint, children }: { legend: string; hint?: string; children: ReactNode }) {
  return (
    <fieldset className="grid gap-3 rounded-md border border-rule p-3 sm:grid-cols-2 lg:grid-cols-4">
      <legend className="px-1 text-sm font-bold text-ink">{legend}</legend>
      {hint && <p className="-mt-1 text-xs text-ink-faint sm:col-span-2 lg:col-span-4">{hint}</p>}
      {children}
    </fieldset>
  );
}

/**
 * Creates a part type, or edits one when `initial` is given. Typed values stay on error and
 * each field shows the server's message for it.
 */
export function PartTypeForm({ initial, onDone, onCancel }: { initial?: PartTypeRow; onDone: (row: PartTypeRow) => void; onCancel?: () => void }) {
  const [form, setForm] = useState<FormState>(() => (initial ? fromRow(initial) : EMPTY));
  const create = useCreatePartType();
  const update = useUpdatePartType();
  const mutation = initial ? update : create;
  const err = mutation.error instanceof ApiError ? mutation.error : null;
  const fe = (field: string) => err?.fieldError(field);
  const set = (k: keyof FormState) => (e: { target: { value: string } }) => setForm((f) => ({ ...f, [k]: e.target.value }));
  const numberField = (k: NumberKey, label: string, hint?: string) => (
    <TextField label={label} name={k} inputMode="decimal" value={form[k]} onChange={set(k)} error={fe(k)} hint={hint} className="num" />
  );

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const body = toBody(form);
    if (initial) update.mutate({ id: initial.id, ...body }, { onSuccess: onDone });
    else create.mutate(body, { onSuccess: onDone });
  };

  const setMethod = (e: { target: { value: string } }) => {
    const method = e.target.value as SamplingMethod;
    setForm((f) => ({ ...f, samplingMethod: method, aql: aqlsForMethod(method).includes(Number(f.aql)) ? f.aql : '1' }));
  };

  const fieldCount = err?.problem.errors?.length ?? 0;

  return (
    <form onSubmit={submit} noValidate aria-label={initial ? 'Edit part type' : 'New part type'} className="flex flex-col gap-4">
      {err && (
        <Notice tone="fail" title={initial ? 'Not saved' : 'Part type not created'}>
          {fieldCount ? `${err.problem.detail} The fields are marked below.` : err.problem.detail}
        </Notice>
      )}
      <Group legend="Identity">
        <TextField label="Our part number" name="partNumber" value={form.partNumber} onChange={set('partNumber')} error={fe('partNumber')} required />
        <div className="sm:col-span-2">
          <TextField label="Description" name="description" value={form.description} onChange={set('description')} error={fe('description')} required />
        </div>
        <SelectField label="Polarity" name="polarity" value={form.polarity} onChange={set('polarity')} error={fe('polarity')} options={POLARITY_OPTIONS} />
        <TextField label="Package" name="packageName" value={form.packageName} onChange={set('packageName')} error={fe('packageName')} hint="e.g. TO-92, SOT-23" required />
        <SelectField label="Moisture sensitivity" name="msl" value={form.msl} onChange={set('msl')} error={fe('msl')} options={MSL_OPTIONS} />
        <SelectField label="ESD class (HBM)" name="esdHbmClass" value={form.esdHbmClass} onChange={set('esdHbmClass')} error={fe('esdHbmClass')} options={ESD_OPTIONS} />
        <label className="flex items-center gap-2 self-end pb-2 text-sm font-semibold text-ink-soft">
          <input type="checkbox" name="active" checked={form.active} onChange={(e) => setForm((f) => ({ ...f, active: e.target.checked }))} className="h-4 w-4 accent-copper" />
          Active (can be received)
        </label>
      </Group>

      <Group legend="Test conditions" hint="Magnitudes; for PNP parts the voltages and currents are negative. Datasheet limits are measured with short pulses.">
        {numberField('hfeIcMa', 'hFE at IC (mA)')}
        {numberField('hfeVceV', 'hFE at VCE (V)')}
        {numberField('vbeIcMa', 'Vbe at IC (mA)')}
      </Group>

      <Group legend="Limits" hint="Leave a side empty for an open limit.">
        {numberField('hfeMin', 'hFE min')}
        {numberField('hfeMax', 'hFE max')}
        {numberField('vbeMinMv', 'Vbe min (mV)')}
        {numberField('vbeMaxMv', 'Vbe max (mV)')}
      </Group>

      <Group legend="Normalising to 25 °C">
        {numberField('vbeTcMvPerC', 'Vbe coefficient (mV/°C)', 'About −2 mV/°C is common practice.')}
        {numberField('hfeTcPctPerC', 'hFE coefficient (%/°C)', 'Roughly +0.5 to +0.7 %/°C; varies by type.')}
      </Group>

      <Group legend="Sampling and matching defaults">
        <SelectField label="Sampling method" name="samplingMethod" value={form.samplingMethod} onChange={setMethod} error={fe('samplingMethod')} options={METHOD_OPTIONS} />
        <SelectField label="Inspection level" name="inspectionLevel" value={form.inspectionLevel} onChange={set('inspectionLevel')} error={fe('inspectionLevel')} options={LEVEL_OPTIONS} />
        <SelectField label="AQL" name="aql" value={form.aql} onChange={set('aql')} error={fe('aql')} options={aqlOptions(form.samplingMethod)} />
        <div />
        {numberField('matchHfePct', 'Match hFE within (%)')}
        {numberField('matchVbeMv', 'Match Vbe within (mV)')}
      </Group>

      <div className="flex justify-end gap-2">
        {onCancel && (
          <Button type="button" onClick={onCancel}>
            Cancel
          </Button>
        )}
        <Button type="submit" variant="primary" busy={mutation.isPending}>
          {initial ? 'Save changes' : 'Create part type'}
        </Button>
      </div>
    </form>
  );
}
