import { useMemo, useState, type FormEvent } from 'react';
import { SCHEME_LOCKED_CODE, type BinSchemeVersionRow } from '../../../../shared/api/catalog.ts';
import type { PartHfeLimits } from '../../../../shared/domain/binning/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateBinScheme } from '../api/create-bin-scheme.ts';
import { useUpdateBinScheme } from '../api/update-bin-scheme.ts';
import { draftsFromBins, draftsToBins, nextDraft, schemeProblems, type BinDraft, type BinDraftField } from '../lib/bin-drafts.ts';
import { BinStrip } from './bin-strip.tsx';

const FIELD_LABELS: Record<BinDraftField, string> = {
  code: 'Code',
  label: 'Label',
  hfeMin: 'hFE min',
  hfeMax: 'hFE max',
  vbeMinMv: 'Vbe min',
  vbeMaxMv: 'Vbe max',
  gapBeforeIntended: 'Gap',
};

const cell = 'w-full rounded border border-rule bg-panel px-1.5 py-1 text-sm text-ink focus:border-copper focus:outline-none aria-[invalid=true]:border-fail aria-[invalid=true]:bg-fail-light/60';

interface Props {
  partTypeId: number;
  limits: PartHfeLimits;
  /** The version whose bins the editor starts from; null for a part without a scheme. */
  base: BinSchemeVersionRow | null;
  /** True when base is the part's current version. */
  baseIsCurrent: boolean;
  onSaved?: (row: BinSchemeVersionRow) => void;
}

/**
 * Edits a gain-bin scheme: one row per bin, checked as you type with the same validateBinScheme
 * the server uses (errors under each row). Saves as the next version, or changes the current
 * version while no lot uses it. A locked version offers "save as new version" only.
 */
export function BinSchemeEditor({ partTypeId, limits, base, baseIsCurrent, onSaved }: Props) {
  const [drafts, setDrafts] = useState<BinDraft[]>(() => (base ? draftsFromBins(base.bins) : [nextDraft(undefined)]));
  const [note, setNote] = useState('');
  const [showProblems, setShowProblems] = useState(false);
  const [saved, setSaved] = useState<string | null>(null);
  const create = useCreateBinScheme();
  const update = useUpdateBinScheme();
  const failed = [create.error, update.error].find((e) => e instanceof ApiError) as ApiError | undefined;
  const lockedConflict = failed?.problem.code === SCHEME_LOCKED_CODE;
  const problems = useMemo(() => schemeProblems(drafts, limits, failed?.problem.errors ?? []), [drafts, limits, failed]);
  const canEditBase = base !== null && baseIsCurrent && !base.locked;
  const busy = create.isPending || update.isPending;

  const touch = () => {
    setSaved(null);
    create.reset();
    update.reset();
  };
  const setField = (i: number, field: BinDraftField, value: string | boolean) => {
    touch();
    setDrafts((ds) => ds.map((d, j) => (j === i ? { ...d, [field]: value } : d)));
  };
  const addRow = () => {
    touch();
    setDrafts((ds) => [...ds, nextDraft(ds[ds.length - 1])]);
  };
  const removeRow = (i: number) => {
    touch();
    setDrafts((ds) => ds.filter((_, j) => j !== i));
  };

  const save = (mode: 'new' | 'edit') => {
    setShowProblems(true);
    setSaved(null);
    // The preview uses the server's own rules: don't send what it already knows will be refused.
    if (schemeProblems(drafts, limits).count > 0) return;
    const body = { partTypeId, note: note.trim() || null, bins: draftsToBins(drafts) };
    const done = (row: BinSchemeVersionRow) => {
      setSaved(mode === 'new' ? `Saved as version ${row.version}.` : `Version ${row.version} changed.`);
      setShowProblems(false);
      setNote('');
      onSaved?.(row);
    };
    if (mode === 'edit' && base) update.mutate({ ...body, version: base.version }, { onSuccess: done });
    else create.mutate(body, { onSuccess: done });
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    save(canEditBase ? 'edit' : 'new');
  };

  // Live preview: rule problems show as you type; "empty field" problems wait until a save is tried.
  const shown = (d: BinDraft, i: number): [BinDraftField, string][] =>
    (Object.entries(problems.rows.get(i) ?? {}) as [BinDraftField, string][]).filter(
      ([field]) => showProblems || failed !== undefined || field === 'gapBeforeIntended' || String(d[field]).trim() !== '',
    );
  const previewCount = drafts.reduce((n, d, i) => n + shown(d, i).length, 0) + problems.scheme.length;
  const limitText = `${limits.hfeMin ?? 'open'} to ${limits.hfeMax ?? 'open'}`;

  return (
    <form onSubmit={submit} noValidate aria-label="Gain-bin scheme editor" className="flex flex-col gap-3">
      <p className="text-sm text-ink-soft">
        {base
          ? canEditBase
            ? `Starting from version ${base.version}, which no lot uses yet: you can change it or save a new version.`
            : `Starting from version ${base.version}${base.locked ? ', which is locked' : ''}: saving creates a new version.`
          : 'This part type has no gain-bin scheme yet. Add bins in ascending hFE order.'}{' '}
        Part hFE limits: <span className="num font-semibold">{limitText}</span>. Each bin covers hFE min ≤ hFE &lt; hFE max; the
        last bin includes its hFE max.
      </p>

      <BinStrip bins={draftsToBins(drafts)} limits={limits} />

      <ScrollBox label="Bins of the scheme being edited" className="rounded-lg border border-rule">
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Bins of the scheme being edited</caption>
          <thead className="bg-paper text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className="px-2 py-2">#</th>
              <th scope="col" className="px-2 py-2">Code</th>
              <th scope="col" className="px-2 py-2">Label</th>
              <th scope="col" className="px-2 py-2 normal-case">hFE min</th>
              <th scope="col" className="px-2 py-2 normal-case">hFE max</th>
              <th scope="col" className="px-2 py-2 normal-case">Vbe min (mV)</th>
              <th scope="col" className="px-2 py-2 normal-case">Vbe max (mV)</th>
              <th scope="col" className="px-2 py-2">Gap before intended</th>
              <th scope="col" className="px-2 py-2"><span className="sr-only">Remove</span></th>
            </tr>
          </thead>
          <tbody>
            {drafts.map((d, i) => {
              const messages = shown(d, i);
              const rowErrors = Object.fromEntries(messages) as Partial<Record<BinDraftField, string>>;
              const errId = `bin-${d.key}-errors`;
              const input = (field: Exclude<BinDraftField, 'gapBeforeIntended'>, width: string, numeric = false) => (
                <input
                  aria-label={`Bin ${i + 1} ${FIELD_LABELS[field]}`}
                  aria-invalid={Boolean(rowErrors[field])}
                  aria-describedby={rowErrors[field] ? errId : undefined}
                  inputMode={numeric ? 'decimal' : undefined}
                  value={d[field]}
                  onChange={(e) => setField(i, field, e.target.value)}
                  className={`${cell} ${width} ${numeric ? 'num text-right' : ''}`}
                />
              );
              return [
                <tr key={d.key} className={messages.length ? 'bg-fail-light/30' : 'border-b border-rule/70'}>
                  <td className="num px-2 py-1 text-ink-faint">{i + 1}</td>
                  <td className="px-2 py-1">{input('code', 'min-w-16')}</td>
                  <td className="px-2 py-1">{input('label', 'min-w-40')}</td>
                  <td className="px-2 py-1">{input('hfeMin', 'min-w-20', true)}</td>
                  <td className="px-2 py-1">{input('hfeMax', 'min-w-20', true)}</td>
                  <td className="px-2 py-1">{input('vbeMinMv', 'min-w-20', true)}</td>
                  <td className="px-2 py-1">{input('vbeMaxMv', 'min-w-20', true)}</td>
                  <td className="px-2 py-1 text-center">
                    <input
                      type="checkbox"
                      aria-label={`Bin ${i + 1} gap before is intended`}
                      checked={d.gapBeforeIntended}
                      disabled={i === 0}
                      onChange={(e) => setField(i, 'gapBeforeIntended', e.target.checked)}
                      className="h-4 w-4 accent-copper"
                    />
                  </td>
                  <td className="px-2 py-1 text-right">
                    <Button type="button" variant="quiet" onClick={() => removeRow(i)} disabled={drafts.length === 1} aria-label={`Remove bin ${i + 1}`}>
                      ✕
                    </Button>
                  </td>
                </tr>,
                messages.length > 0 && (
                  <tr key={`${d.key}-err`} className="border-b border-rule/70 bg-fail-light/30">
                    <td />
                    <td colSpan={8} className="px-2 pb-2">
                      <ul id={errId} className="text-xs font-semibold text-fail" data-testid={`bin-${i + 1}-errors`}>
                        {messages.map(([field, message]) => (
                          <li key={field}>
                            ✕ Bin {i + 1} {FIELD_LABELS[field]}: {message}
                          </li>
                        ))}
                      </ul>
                    </td>
                  </tr>
                ),
              ];
            })}
          </tbody>
        </table>
      </ScrollBox>

      <p className={`text-sm font-semibold ${previewCount ? 'text-fail' : 'text-pass'}`} role="status" data-testid="scheme-preview">
        {previewCount
          ? `✕ ${previewCount === 1 ? '1 problem' : `${previewCount} problems`} in this scheme`
          : drafts.some((d) => d.hfeMin.trim() === '' || d.hfeMax.trim() === '' || d.code.trim() === '')
            ? 'Fill in each bin; the rules are checked as you type.'
            : '✓ The bins pass the checks: in order, no overlap, no unintended gap, inside the part limits.'}
      </p>
      {problems.scheme.length > 0 && <Notice tone="fail">{problems.scheme.join(' ')}</Notice>}
      {showProblems && problems.count > 0 && !failed && (
        <Notice tone="fail" title="Not saved">
          Fix the {problems.count === 1 ? 'problem' : `${problems.count} problems`} marked in the rows above, then save again.
        </Notice>
      )}
      {failed && !lockedConflict && !failed.problem.errors?.length && <Notice tone="fail">{failed.problem.detail}</Notice>}
      {lockedConflict && (
        <Notice tone="hold" title="This version can no longer change">
          <p>{failed.problem.detail}</p>
          <Button type="button" variant="primary" className="mt-2" busy={create.isPending} onClick={() => save('new')}>
            Save as new version
          </Button>
        </Notice>
      )}
      {saved && !onSaved && <Notice tone="pass" title="Scheme saved">{saved}</Notice>}

      <div className="flex flex-wrap items-end gap-3">
        <Button type="button" onClick={addRow} disabled={drafts.length >= 40}>
          + Add bin
        </Button>
        <label className="flex min-w-64 flex-1 flex-col gap-1 text-sm font-semibold text-ink-soft">
          Note for this version (optional)
          <input
            value={note}
            maxLength={300}
            onChange={(e) => setNote(e.target.value)}
            placeholder="e.g. narrower bins for the phono stage"
            className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
          />
        </label>
        {canEditBase && (
          <Button type="button" busy={update.isPending} disabled={busy} onClick={() => save('edit')}>
            Save changes to version {base.version}
          </Button>
        )}
        <Button type="button" variant="primary" busy={create.isPending} disabled={busy} onClick={() => save('new')}>
          {base ? 'Save as new version' : 'Save as version 1'}
        </Button>
      </div>
    </form>
  );
}
