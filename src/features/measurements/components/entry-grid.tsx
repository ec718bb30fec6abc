import { useEffect, useRef, useState, type KeyboardEvent } from 'react';
import type { MeasurementRow, SessionRow, VoltageUnit } from '../../../../shared/api/measurements.ts';
import { checkReading, describeFlag, limitFlags, type LimitFlag, type PartLimits } from '../../../../shared/domain/inspection/index.ts';
import { normaliseHfe, normaliseVbeMv } from '../../../../shared/domain/normalise/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCorrectMeasurement } from '../api/correct-measurement.ts';
import { useRecordMeasurement } from '../api/record-measurement.ts';

export interface PartForEntry extends PartLimits {
  hfeTcPctPerC: number;
  vbeTcMvPerC: number;
}

type Field = 'position' | 'hfe' | 'vbe' | 'vceSat' | 'leakage' | 'reason';
type Line = Record<Field, string>;

const EMPTY: Omit<Line, 'position'> = { hfe: '', vbe: '', vceSat: '', leakage: '', reason: '' };
const UNIT_KEY = 'binwright.bench.vbeUnit';

const num = (s: string) => (s.trim() === '' ? NaN : Number(s.trim().replace(',', '.')));

/** Live check of the line: plausibility errors, and the limits broken at 25 °C. */
function assess(line: Line, vbeUnit: VoltageUnit, part: PartForEntry, ambientC: number) {
  const hfe = num(line.hfe);
  const vbe = num(line.vbe);
  const optional = {
    vceSat: line.vceSat.trim() ? num(line.vceSat) : null,
    leakage: line.leakage.trim() ? num(line.leakage) : null,
  };
  const { reading, errors } = checkReading({ hfe, vbe, vbeUnit, ...optional, vceSatUnit: 'mV', leakageUnit: 'nA' });
  // Show only errors of fields that hold something; an empty field is simply not done yet.
  const shown = errors.filter((e) => line[e.field].trim() !== '');
  let flags: LimitFlag[] = [];
  let at25: { hfe: number; vbeMv: number } | null = null;
  if (reading) {
    at25 = { hfe: normaliseHfe(reading.hfe, ambientC, part.hfeTcPctPerC), vbeMv: normaliseVbeMv(reading.vbeMv, ambientC, part.vbeTcMvPerC) };
    flags = limitFlags(part, at25.hfe, at25.vbeMv);
  } else if (Number.isFinite(hfe) && !errors.some((e) => e.field === 'hfe')) {
    // hFE alone is known: flag it at once, before Vbe is typed.
    flags = limitFlags({ ...part, vbeMinMv: null, vbeMaxMv: null }, normaliseHfe(hfe, ambientC, part.hfeTcPctPerC), 0);
  }
  return { reading, errors: shown, flags, at25 };
}

function FlagText({ flags, limits }: { flags: LimitFlag[]; limits: PartLimits }) {
  if (!flags.length) return <StatusTag tone="pass">within limits</StatusTag>;
  return <StatusTag tone="fail">{flags.map((f) => describeFlag(f, limits)).join('; ')}</StatusTag>;
}

/**
 * Keyboard-first entry of readings: type hFE, Enter, Vbe, Enter — the part is recorded and the
 * next position is ready. A value outside the part's limits (at 25 °C) is flagged at once in
 * colour and in words. A recorded reading is corrected, never edited: the correction supersedes it.
 */
export function EntryGrid({
  lotId,
  session,
  part,
  nextPosition,
  quantity,
  onRecorded,
}: {
  lotId: number;
  session: SessionRow;
  part: PartForEntry;
  nextPosition: number;
  quantity: number;
  onRecorded: () => void;
}) {
  const [vbeUnit, setVbeUnit] = useState<VoltageUnit>(() => (localStorage.getItem(UNIT_KEY) === 'V' ? 'V' : 'mV'));
  const [optional, setOptional] = useState(false);
  const [line, setLine] = useState<Line>({ position: String(nextPosition), ...EMPTY });
  const [entries, setEntries] = useState<MeasurementRow[]>([]);
  const [correcting, setCorrecting] = useState<MeasurementRow | null>(null);
  const [hint, setHint] = useState<string | null>(null);
  const [saving, setSaving] = useState<{ key: number; position: number; hfe: string; vbe: string }[]>([]);
  const [serverError, setServerError] = useState<ApiError | null>(null);
  const [resumeAt, setResumeAt] = useState<string | null>(null);
  const seq = useRef(0);
  const refs = useRef<Partial<Record<Field, HTMLInputElement | null>>>({});
  const record = useRecordMeasurement(lotId);
  const correct = useCorrectMeasurement(lotId);

  useEffect(() => {
    refs.current.hfe?.focus();
  }, []);

  const order: Field[] = ['position', 'hfe', 'vbe', ...(optional ? (['vceSat', 'leakage'] as Field[]) : []), ...(correcting ? (['reason'] as Field[]) : [])];
  const a = assess(line, vbeUnit, part, session.ambientC);
  const set = (f: Field) => (e: { target: { value: string } }) => {
    setHint(null);
    setLine((l) => ({ ...l, [f]: e.target.value }));
  };

  /**
   * Records without waiting: the line clears at once for the next part while the reading is
   * saved, so a fast typist never loses keystrokes. A reading the server refuses comes back into
   * the line with the reason.
   */
  const submit = () => {
    if (!a.reading) {
      setHint(line.hfe.trim() === '' ? 'Type the hFE reading.' : line.vbe.trim() === '' ? 'Type the Vbe reading.' : 'Fix the marked value first.');
      refs.current[line.hfe.trim() === '' || a.errors.some((e) => e.field === 'hfe') ? 'hfe' : 'vbe']?.focus();
      return;
    }
    if (correcting && line.reason.trim().length < 3) {
      setHint('Say why the reading is corrected.');
      refs.current.reason?.focus();
      return;
    }
    const typed = line;
    const target = correcting;
    const position = Number(typed.position);
    const body = {
      sessionId: session.id,
      hfe: a.reading.hfe,
      vbe: num(typed.vbe),
      vbeUnit,
      vceSat: typed.vceSat.trim() ? num(typed.vceSat) : null,
      vceSatUnit: 'mV' as const,
      leakage: typed.leakage.trim() ? num(typed.leakage) : null,
      leakageUnit: 'nA' as const,
    };
    const key = ++seq.current;
    setSaving((list) => [...list, { key, position, hfe: typed.hfe, vbe: typed.vbe }]);
    setServerError(null);
    setHint(null);
    setCorrecting(null);
    setLine({ position: target ? (resumeAt ?? String(nextPosition)) : String(Math.min(position + 1, quantity)), ...EMPTY });
    setResumeAt(null);
    refs.current.hfe?.focus();
    const request = target
      ? correct.mutateAsync({ measurementId: target.id, body: { ...body, reason: typed.reason.trim() } })
      : record.mutateAsync({ ...body, position });
    request
      .then((row) => {
        setEntries((list) => [...list.filter((r) => r.position !== row.position), row].slice(-12));
        onRecorded();
      })
      .catch((e: unknown) => {
        setServerError(e instanceof ApiError ? e : new ApiError({ type: 'about:blank', title: 'Error', status: 0, detail: String(e) }));
        if (target) setCorrecting(target);
        setLine(typed);
        refs.current.hfe?.focus();
      })
      .finally(() => setSaving((list) => list.filter((x) => x.key !== key)));
  };

  const onKeyDown = (f: Field, e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'Escape') {
      e.preventDefault();
      setCorrecting(null);
      setLine((l) => ({ position: correcting ? (resumeAt ?? String(nextPosition)) : l.position, ...EMPTY }));
      setResumeAt(null);
      refs.current.hfe?.focus();
      return;
    }
    if (e.key !== 'Enter') return;
    e.preventDefault();
    const i = order.indexOf(f);
    if (f === 'hfe' && line.hfe.trim() === '') return setHint('Type the hFE reading.');
    if (f === 'vbe' && line.vbe.trim() === '') return setHint('Type the Vbe reading.');
    if (i === order.length - 1 || (f === 'vbe' && !optional && !correcting)) submit();
    else refs.current[order[i + 1]]?.focus();
  };

  const startCorrection = (row: MeasurementRow) => {
    if (!correcting) setResumeAt(line.position);
    setCorrecting(row);
    setServerError(null);
    setLine({ position: String(row.position), hfe: String(row.hfe), vbe: vbeUnit === 'V' ? String(row.vbeMv / 1000) : String(row.vbeMv), vceSat: row.vceSatMv === null ? '' : String(row.vceSatMv), leakage: row.leakageNa === null ? '' : String(row.leakageNa), reason: '' });
    setTimeout(() => refs.current.hfe?.select(), 0);
  };

  const cell = (f: Field, bad: boolean) =>
    `w-full rounded border px-2 py-1.5 text-base num focus:outline-none focus:ring-2 focus:ring-copper ${bad ? 'border-fail bg-fail-light text-fail font-semibold' : 'border-rule bg-panel text-ink'} ${f === 'position' && correcting ? 'opacity-60' : ''}`;
  const hfeBad = a.flags.some((x) => x.startsWith('hfe')) || a.errors.some((e) => e.field === 'hfe');
  const vbeBad = a.flags.some((x) => x.startsWith('vbe')) || a.errors.some((e) => e.field === 'vbe');

  return (
    <div className="flex flex-col gap-3" aria-label="Entry grid">
      <div className="flex flex-wrap items-center gap-4 text-sm">
        <fieldset className="flex items-center gap-2">
          <legend className="sr-only">Vbe unit</legend>
          <span className="font-semibold text-ink-soft">Vbe entered in</span>
          {(['mV', 'V'] as const).map((u) => (
            <label key={u} className="flex items-center gap-1">
              <input
                type="radio"
                name="vbe-unit"
                checked={vbeUnit === u}
                onChange={() => {
                  setVbeUnit(u);
                  localStorage.setItem(UNIT_KEY, u);
                }}
              />
              {u}
            </label>
          ))}
        </fieldset>
        <label className="flex items-center gap-1.5">
          <input type="checkbox" checked={optional} onChange={(e) => setOptional(e.target.checked)} />
          Also VCE(sat) (mV) and leakage (nA)
        </label>
        <span className="text-ink-faint">Enter moves on · Enter on the last field records · Esc clears</span>
      </div>

      <table className="w-full border-collapse text-sm">
        <thead>
          <tr className="text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
            <th className="w-24 px-1 py-1">Position</th>
            <th className="px-1 py-1">hFE</th>
            <th className="px-1 py-1">Vbe ({vbeUnit})</th>
            {optional && <th className="px-1 py-1">VCE(sat) mV</th>}
            {optional && <th className="px-1 py-1">Leakage nA</th>}
            {correcting && <th className="px-1 py-1">Reason for correction</th>}
          </tr>
        </thead>
        <tbody>
          <tr>
            <td className="px-1">
              <input
                ref={(el) => {
                  refs.current.position = el;
                }}
                aria-label="Position"
                inputMode="numeric"
                readOnly={Boolean(correcting)}
                value={line.position}
                onChange={set('position')}
                onKeyDown={(e) => onKeyDown('position', e)}
                className={cell('position', Boolean(serverError?.fieldError('position')))}
              />
            </td>
            <td className="px-1">
              <input
                ref={(el) => {
                  refs.current.hfe = el;
                }}
                aria-label="hFE"
                aria-invalid={hfeBad}
                inputMode="decimal"
                autoComplete="off"
                value={line.hfe}
                onChange={set('hfe')}
                onKeyDown={(e) => onKeyDown('hfe', e)}
                className={cell('hfe', hfeBad)}
              />
            </td>
            <td className="px-1">
              <input
                ref={(el) => {
                  refs.current.vbe = el;
                }}
                aria-label={`Vbe (${vbeUnit})`}
                aria-invalid={vbeBad}
                inputMode="decimal"
                autoComplete="off"
                value={line.vbe}
                onChange={set('vbe')}
                onKeyDown={(e) => onKeyDown('vbe', e)}
                className={cell('vbe', vbeBad)}
              />
            </td>
            {optional && (
              <td className="px-1">
                <input
                  ref={(el) => {
                    refs.current.vceSat = el;
                  }}
                  aria-label="VCE(sat) (mV)"
                  inputMode="decimal"
                  value={line.vceSat}
                  onChange={set('vceSat')}
                  onKeyDown={(e) => onKeyDown('vceSat', e)}
                  className={cell('vceSat', a.errors.some((e) => e.field === 'vceSat'))}
                />
              </td>
            )}
            {optional && (
              <td className="px-1">
                <input
                  ref={(el) => {
                    refs.current.leakage = el;
                  }}
                  aria-label="Leakage (nA)"
                  inputMode="decimal"
                  value={line.leakage}
                  onChange={set('leakage')}
                  onKeyDown={(e) => onKeyDown('leakage', e)}
                  className={cell('leakage', a.errors.some((e) => e.field === 'leakage'))}
                />
              </td>
            )}
            {correcting && (
              <td className="px-1">
                <input
                  ref={(el) => {
                    refs.current.reason = el;
                  }}
                  aria-label="Reason for correction"
                  value={line.reason}
                  onChange={set('reason')}
                  onKeyDown={(e) => onKeyDown('reason', e)}
                  className={cell('reason', false)}
                />
              </td>
            )}
          </tr>
        </tbody>
      </table>

      <div aria-live="polite" className="min-h-6 text-sm" data-testid="entry-status">
        {a.errors.length > 0 ? (
          <p className="font-semibold text-fail">✕ {a.errors.map((e) => e.message).join('; ')}</p>
        ) : a.flags.length > 0 ? (
          <p className="font-semibold text-fail" data-testid="limit-flag">
            ✕ Outside limits: {a.flags.map((f) => describeFlag(f, part)).join('; ')}
            {a.at25 ? ` (at 25 °C: hFE ${a.at25.hfe.toFixed(1)}, Vbe ${a.at25.vbeMv.toFixed(1)} mV)` : ''} — it is recorded and counted as nonconforming.
          </p>
        ) : a.at25 ? (
          <p className="text-pass">
            ✓ Within limits at 25 °C: hFE {a.at25.hfe.toFixed(1)}, Vbe {a.at25.vbeMv.toFixed(1)} mV
          </p>
        ) : (
          <p className="text-ink-faint">{correcting ? `Correcting position ${correcting.position}: the old reading is kept and marked superseded.` : `Position ${line.position}: type hFE, Enter, then Vbe, Enter.`}</p>
        )}
        {hint && <p className="text-hold">{hint}</p>}
      </div>
      {serverError && <Notice tone="fail">{serverError.problem.errors?.map((e) => e.message).join('; ') || serverError.problem.detail}</Notice>}
      {saving.length > 0 && (
        <p className="text-sm text-ink-soft" aria-live="polite">
          Saving position {saving.map((x) => x.position).join(', ')}…
        </p>
      )}

      {entries.length > 0 && (
        <table className="w-full border-collapse text-sm" aria-label="Readings recorded in this sitting">
          <thead>
            <tr className="border-b border-rule text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
              <th className="px-2 py-1">Pos</th>
              <th className="px-2 py-1 text-right">hFE</th>
              <th className="px-2 py-1 text-right">Vbe mV</th>
              <th className="px-2 py-1 text-right">hFE 25 °C</th>
              <th className="px-2 py-1 text-right">Vbe 25 °C</th>
              <th className="px-2 py-1">Result</th>
              <th className="px-2 py-1" />
            </tr>
          </thead>
          <tbody>
            {[...entries].reverse().map((r) => (
              <tr key={r.id} className={`border-b border-rule/60 ${r.flags.length ? 'bg-fail-light/60' : ''}`}>
                <td className="num px-2 py-1">{r.position}</td>
                <td className="num px-2 py-1 text-right">{r.hfe}</td>
                <td className="num px-2 py-1 text-right">{r.vbeMv.toFixed(1)}</td>
                <td className="num px-2 py-1 text-right">{r.hfe25.toFixed(1)}</td>
                <td className="num px-2 py-1 text-right">{r.vbeMv25.toFixed(1)}</td>
                <td className="px-2 py-1">
                  <FlagText flags={r.flags} limits={part} />
                  {r.supersedesId && <span className="ml-1 text-xs text-ink-faint">corrected</span>}
                </td>
                <td className="px-2 py-1 text-right">
                  <Button variant="quiet" onClick={() => startCorrection(r)} aria-label={`Correct position ${r.position}`}>
                    Correct
                  </Button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
