import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import type { ParseLabelResponse } from '../../../../shared/api/labels.ts';
import { DRY_BAG_LABELS, DRY_BAG_STATES, LOT_MSL_VALUES, type CreateLotRequest, type DryBagState, type LotDetail, type ReceivingOptions } from '../../../../shared/api/lots.ts';
import type { Role } from '../../../../shared/api/roles.ts';
import { MSL_FLOOR_LIFE, normaliseMslLevel } from '../../../../shared/domain/moisture/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { FieldShell, SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateLot } from '../api/create-lot.ts';
import { toLocalInput } from './format.ts';

interface Form {
  supplierId: string;
  partTypeId: string;
  quantity: string;
  purchaseOrder: string;
  supplierPartNumber: string;
  supplierLot: string;
  dateCode: string;
  countryOfOrigin: string;
  msl: string;
  dryBag: DryBagState;
  bagOpenedAt: string;
  overrideReason: string;
}

const CLOCKED = new Set(['2a', '3', '4', '5', '5a', '6']);

function effectiveMsl(form: Pick<Form, 'msl' | 'partTypeId'>, options?: ReceivingOptions): string | null {
  const part = options?.partTypes.find((p) => String(p.id) === form.partTypeId);
  return normaliseMslLevel(form.msl) ?? normaliseMslLevel(part?.msl ?? '');
}

function initialForm(parsed: ParseLabelResponse | null, options?: ReceivingOptions): Form {
  const f = parsed?.fields;
  const match = parsed && parsed.matches.length === 1 ? parsed.matches[0] : null;
  const partTypeId = String(match?.partTypeId ?? parsed?.customerPartType?.partTypeId ?? '');
  const msl = f?.msl ?? '';
  const level = effectiveMsl({ msl, partTypeId }, options);
  return {
    supplierId: String(match?.supplierId ?? ''),
    partTypeId,
    quantity: f?.quantity != null ? String(f.quantity) : '',
    purchaseOrder: f?.purchaseOrder ?? (parsed?.plainCodeKind === 'purchaseOrder' ? (parsed.plainCode ?? '') : ''),
    supplierPartNumber: f?.supplierPartNumber ?? '',
    supplierLot: f?.supplierLot ?? '',
    dateCode: f?.dateCode ?? '',
    countryOfOrigin: f?.countryOfOrigin ?? '',
    msl,
    dryBag: level && CLOCKED.has(level) ? 'sealed' : 'not-applicable',
    bagOpenedAt: toLocalInput(new Date()),
    overrideReason: '',
  };
}

const blank = (s: string) => (s.trim() === '' ? null : s.trim());

/**
 * The receiving form, filled from the scanned label (mount it with a new key per scan). Every
 * field stays editable; the server checks everything again and names any field it refuses.
 */
export function ReceiveLotForm({
  parsed,
  options,
  role,
  lotHref,
  onReceived,
}: {
  parsed: ParseLabelResponse | null;
  options?: ReceivingOptions;
  role: Role;
  lotHref: (id: number) => string;
  onReceived: (lot: LotDetail) => void;
}) {
  const [form, setForm] = useState<Form>(() => initialForm(parsed, options));
  const [dryBagTouched, setDryBagTouched] = useState(false);
  const create = useCreateLot();
  const err = create.error instanceof ApiError ? create.error : null;
  const set = (k: keyof Form) => (e: { target: { value: string } }) => setForm((f) => ({ ...f, [k]: e.target.value }));
  /** A new part type or MSL suggests the dry-bag state again, until the user chose one. */
  const suggestDryBag = (next: Form): Form => {
    if (dryBagTouched) return next;
    const lvl = effectiveMsl(next, options);
    return { ...next, dryBag: lvl && CLOCKED.has(lvl) ? 'sealed' : 'not-applicable' };
  };
  const setMoisture = (k: 'partTypeId' | 'msl') => (e: { target: { value: string } }) => setForm((f) => suggestDryBag({ ...f, [k]: e.target.value }));

  const supplier = options?.suppliers.find((s) => String(s.id) === form.supplierId);
  const partType = options?.partTypes.find((p) => String(p.id) === form.partTypeId);
  const level = effectiveMsl(form, options);
  const notApproved = supplier?.approval === 'not-approved';
  const blocked = Boolean(parsed?.duplicateOf) || (notApproved && role !== 'quality');
  const knownFields = ['supplierId', 'partTypeId', 'quantity', 'purchaseOrder', 'supplierPartNumber', 'supplierLot', 'dateCode', 'countryOfOrigin', 'msl', 'dryBag', 'bagOpenedAt', 'override.reason'];
  const generalError = err && !err.problem.errors?.some((e) => knownFields.includes(e.field)) ? err.problem.detail : null;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (blocked) return;
    const body: CreateLotRequest = {
      supplierId: form.supplierId ? Number(form.supplierId) : (null as unknown as number),
      partTypeId: form.partTypeId ? Number(form.partTypeId) : (null as unknown as number),
      quantity: form.quantity.trim() === '' ? (null as unknown as number) : Number(form.quantity),
      purchaseOrder: blank(form.purchaseOrder),
      supplierPartNumber: blank(form.supplierPartNumber),
      supplierLot: blank(form.supplierLot),
      dateCode: blank(form.dateCode),
      countryOfOrigin: blank(form.countryOfOrigin),
      msl: blank(form.msl),
      dryBag: form.dryBag,
      ...(form.dryBag === 'opened' && form.bagOpenedAt ? { bagOpenedAt: new Date(form.bagOpenedAt).toISOString() } : {}),
      ...(parsed?.format ? { labelText: parsed.raw } : {}),
      ...(notApproved ? { override: { reason: form.overrideReason } } : {}),
    };
    create.mutate(body, { onSuccess: onReceived });
  };

  return (
    <form onSubmit={submit} noValidate aria-label="Receive lot" className="grid gap-4">
      {parsed?.duplicateOf && (
        <Notice tone="fail" title="This label was already received">
          It is lot{' '}
          <Link to={lotHref(parsed.duplicateOf.lotId)} className="font-semibold underline">
            {parsed.duplicateOf.code}
          </Link>
          . A second lot is not created from the same label; add to that lot or check the reel.
        </Notice>
      )}
      {parsed && parsed.matches.length > 1 && (
        <fieldset className="grid gap-1 rounded-md border border-rule p-3">
          <legend className="px-1 text-sm font-semibold text-ink-soft">Several suppliers map {parsed.fields.supplierPartNumber}: choose one</legend>
          {parsed.matches.map((m) => (
            <label key={`${m.supplierId}-${m.partTypeId}`} className="flex items-center gap-2 text-sm">
              <input
                type="radio"
                name="match"
                checked={form.supplierId === String(m.supplierId) && form.partTypeId === String(m.partTypeId)}
                onChange={() => setForm((f) => suggestDryBag({ ...f, supplierId: String(m.supplierId), partTypeId: String(m.partTypeId) }))}
              />
              {m.supplierName} ({m.supplierCode}) → {m.partNumber}
              {m.approval !== 'approved' && <span className="text-xs font-semibold text-hold">{m.approval}</span>}
            </label>
          ))}
        </fieldset>
      )}
      {parsed?.format && parsed.fields.supplierPartNumber && parsed.matches.length === 0 && (
        <Notice tone="hold" title="Supplier part number not mapped">
          {parsed.fields.supplierPartNumber} is not mapped to one of our part types. Choose the supplier and part type; ask quality to add the mapping in the Catalog.
        </Notice>
      )}

      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Supplier"
          value={form.supplierId}
          onChange={set('supplierId')}
          error={err?.fieldError('supplierId')}
          options={[
            { value: '', label: options ? 'Choose a supplier…' : 'Loading…' },
            ...(options?.suppliers ?? []).map((s) => ({ value: String(s.id), label: `${s.name} (${s.code})${s.approval === 'approved' ? '' : ` — ${s.approval}`}` })),
          ]}
        />
        <SelectField
          label="Part type"
          value={form.partTypeId}
          onChange={setMoisture('partTypeId')}
          error={err?.fieldError('partTypeId')}
          options={[
            { value: '', label: options ? 'Choose a part type…' : 'Loading…' },
            ...(options?.partTypes ?? []).map((p) => ({ value: String(p.id), label: `${p.partNumber} — ${p.description}` })),
          ]}
        />
      </div>

      {supplier?.approval === 'conditional' && (
        <Notice tone="hold" title={`${supplier.name} is conditionally approved`}>
          Receive as usual and follow the conditions quality recorded for this supplier.
        </Notice>
      )}
      {notApproved && (
        <Notice tone="fail" title={`${supplier?.name} is not an approved supplier`}>
          {role === 'quality'
            ? 'Receiving needs your override as quality engineer. Say why; the reason is kept with the lot and in the audit trail.'
            : 'Receiving from this supplier needs a quality engineer’s override. Ask a quality engineer to receive this lot.'}
        </Notice>
      )}
      {notApproved && role === 'quality' && (
        <FieldShell label="Override reason" error={err?.fieldError('override.reason')} hint="At least 10 characters.">
          {({ id, describedBy, invalid }) => (
            <textarea
              id={id}
              aria-describedby={describedBy}
              aria-invalid={invalid}
              rows={2}
              value={form.overrideReason}
              onChange={set('overrideReason')}
              className="w-full rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base text-ink focus:border-copper focus:outline-none aria-[invalid=true]:border-fail"
            />
          )}
        </FieldShell>
      )}

      <div className="grid gap-3 sm:grid-cols-3">
        <TextField label="Quantity (pcs)" inputMode="numeric" value={form.quantity} onChange={set('quantity')} error={err?.fieldError('quantity')} />
        <TextField label="Purchase order" value={form.purchaseOrder} onChange={set('purchaseOrder')} error={err?.fieldError('purchaseOrder')} />
        <TextField label="Supplier part number" value={form.supplierPartNumber} onChange={set('supplierPartNumber')} error={err?.fieldError('supplierPartNumber')} />
        <TextField label="Supplier lot" value={form.supplierLot} onChange={set('supplierLot')} error={err?.fieldError('supplierLot')} />
        <TextField label="Date code" value={form.dateCode} onChange={set('dateCode')} error={err?.fieldError('dateCode')} />
        <TextField label="Country of origin" hint="ISO 3166 two letters" maxLength={2} value={form.countryOfOrigin} onChange={set('countryOfOrigin')} error={err?.fieldError('countryOfOrigin')} />
      </div>

      <div className="grid gap-3 sm:grid-cols-3">
        <SelectField
          label="MSL on the label"
          value={form.msl}
          onChange={setMoisture('msl')}
          error={err?.fieldError('msl')}
          hint={partType ? `Part type: ${partType.msl === 'not-classified' ? 'not classified' : `MSL ${partType.msl}`}` : undefined}
          options={[{ value: '', label: 'Not on the label' }, ...LOT_MSL_VALUES.map((m) => ({ value: m, label: m === 'not-classified' ? 'Not classified' : `MSL ${m}` }))]}
        />
        <fieldset className="flex flex-col gap-1 sm:col-span-2">
          <legend className="mb-1 text-sm font-semibold text-ink-soft">Dry bag</legend>
          <div className="flex flex-wrap gap-4">
            {DRY_BAG_STATES.map((s) => (
              <label key={s} className="flex items-center gap-1.5 text-sm">
                <input
                  type="radio"
                  name="dryBag"
                  value={s}
                  checked={form.dryBag === s}
                  onChange={(e) => {
                    setDryBagTouched(true);
                    set('dryBag')(e);
                  }}
                />
                {DRY_BAG_LABELS[s]}
              </label>
            ))}
          </div>
          {err?.fieldError('dryBag') && <p className="text-xs font-semibold text-fail">✕ {err.fieldError('dryBag')}</p>}
        </fieldset>
      </div>
      {form.dryBag === 'opened' && (
        <div className="max-w-xs">
          <TextField label="Bag opened at" type="datetime-local" value={form.bagOpenedAt} onChange={set('bagOpenedAt')} error={err?.fieldError('bagOpenedAt')} />
        </div>
      )}
      {level && CLOCKED.has(level) && (
        <Notice tone="hold" title={`MSL ${level}: moisture-sensitive`}>
          Floor life {level === '6' ? 'starts only after a bake' : `${MSL_FLOOR_LIFE[level as keyof typeof MSL_FLOOR_LIFE].hours} h at ≤ 30 °C / 60 % RH`} once the dry bag is opened. Keep the bag
          sealed until use; if the floor life runs out, bake per J-STD-033 and your local procedure.
          {form.dryBag === 'not-applicable' && ' Received without a dry bag: ask quality whether a bake is needed.'}
        </Notice>
      )}
      {partType && (
        <p className="text-xs text-ink-soft">
          ESD: {partType.esdHbmClass ? `HBM class ${partType.esdHbmClass}` : 'class not stated'} — handle at an ESD-protected workstation.
        </p>
      )}

      {generalError && <Notice tone="fail">{generalError}</Notice>}
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" busy={create.isPending} disabled={blocked}>
          Receive lot
        </Button>
        {blocked && <span className="text-sm text-ink-soft">{parsed?.duplicateOf ? 'Already received.' : 'Needs a quality engineer.'}</span>}
      </div>
    </form>
  );
}
