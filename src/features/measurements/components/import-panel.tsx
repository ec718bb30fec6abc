import Papa from 'papaparse';
import { useState } from 'react';
import { useDropzone } from 'react-dropzone';
import { useQueryClient } from '@tanstack/react-query';
import type { CurrentUnit, ImportMapping, ImportProgress, ImportResult, ImportUnits, SessionRow, VoltageUnit } from '../../../../shared/api/measurements.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useInstrumentMapping } from '../api/get-instrument-mapping.ts';
import { importMeasurements } from '../api/import-measurements.ts';
import { measurementKeys } from '../api/keys.ts';

type MapField = keyof ImportMapping;
const FIELDS: { key: MapField; label: string; required: boolean; guess: RegExp }[] = [
  { key: 'position', label: 'Position', required: true, guess: /^(pos|position|part|index|no\.?|#)/i },
  { key: 'hfe', label: 'hFE', required: true, guess: /h_?fe|gain|beta/i },
  { key: 'vbe', label: 'Vbe', required: true, guess: /v_?be/i },
  { key: 'vceSat', label: 'VCE(sat)', required: false, guess: /sat/i },
  { key: 'leakage', label: 'Leakage', required: false, guess: /leak|icbo|iceo|ices/i },
];
const PREVIEW_ROWS = 5;
const MAX_LISTED = 25;

interface Preview {
  file: File;
  header: string[];
  rows: string[][];
}

function guessMapping(header: string[]): ImportMapping {
  const pick = (re: RegExp) => header.find((h) => re.test(h)) ?? '';
  return { position: pick(FIELDS[0].guess), hfe: pick(FIELDS[1].guess), vbe: pick(FIELDS[2].guess), vceSat: pick(FIELDS[3].guess) || null, leakage: pick(FIELDS[4].guess) || null };
}

/** Volts when the header says so or the first values are below 5 (a Vbe is about 0.6 V). */
function guessVbeUnit(p: Preview, column: string): VoltageUnit {
  if (/\(v\)|_v\b|\bv$/i.test(column)) return 'V';
  const i = p.header.indexOf(column);
  const values = p.rows.map((r) => Number(r[i])).filter((v) => Number.isFinite(v));
  return values.length && values.every((v) => v < 5) ? 'V' : 'mV';
}

/**
 * Tester CSV import: drop a file, see its first rows, map its columns to our fields (remembered per
 * instrument), state the units, import. The server checks the whole file first and writes nothing
 * when a row is bad; the upload and the server's phases are shown while it works.
 */
export function ImportPanel({ lotId, session, onImported }: { lotId: number; session: SessionRow; onImported: () => void }) {
  const [preview, setPreview] = useState<Preview | null>(null);
  const [readError, setReadError] = useState<string | null>(null);
  const [mapping, setMapping] = useState<ImportMapping>({ position: '', hfe: '', vbe: '', vceSat: null, leakage: null });
  const [units, setUnits] = useState<ImportUnits>({ vbe: 'mV', vceSat: 'mV', leakage: 'nA' });
  const [upload, setUpload] = useState<number | null>(null);
  const [phase, setPhase] = useState<ImportProgress | null>(null);
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<ImportResult | null>(null);
  const [error, setError] = useState<ApiError | null>(null);
  const remembered = useInstrumentMapping(session.instrument);
  const qc = useQueryClient();

  // A remembered mapping of this instrument wins over guessing, when its columns are in the file.
  const applyMapping = (p: Preview) => {
    const saved = remembered.data;
    if (saved && [saved.mapping.position, saved.mapping.hfe, saved.mapping.vbe].every((c) => p.header.includes(c))) {
      setMapping(saved.mapping);
      setUnits(saved.units);
    } else {
      const g = guessMapping(p.header);
      setMapping(g);
      setUnits((u) => ({ ...u, vbe: g.vbe ? guessVbeUnit(p, g.vbe) : u.vbe }));
    }
  };

  const onDrop = (files: File[]) => {
    const file = files[0];
    if (!file) return;
    setResult(null);
    setError(null);
    setReadError(null);
    Papa.parse<string[]>(file, {
      preview: PREVIEW_ROWS + 1,
      skipEmptyLines: 'greedy',
      complete: (r) => {
        if (r.data.length < 2) {
          setReadError(`${file.name} has no data rows under a header.`);
          setPreview(null);
          return;
        }
        const p = { file, header: r.data[0].map((h) => h.trim()), rows: r.data.slice(1) };
        setPreview(p);
        applyMapping(p);
      },
      error: (e) => setReadError(`${file.name} could not be read: ${e.message}`),
    });
  };
  const dz = useDropzone({ onDrop, multiple: false, accept: { 'text/csv': ['.csv', '.txt'] }, disabled: busy });

  const missing = FIELDS.filter((f) => f.required && !mapping[f.key]).map((f) => f.label);
  const run = async () => {
    if (!preview) return;
    setBusy(true);
    setError(null);
    setResult(null);
    setUpload(0);
    setPhase(null);
    try {
      const res = await importMeasurements({ lotId, sessionId: session.id, file: preview.file, mapping, units }, { onUpload: setUpload, onPhase: setPhase });
      setResult(res);
      setPreview(null);
      qc.invalidateQueries({ queryKey: measurementKeys.mapping(session.instrument) });
      onImported();
    } catch (e) {
      setError(e instanceof ApiError ? e : new ApiError({ type: 'about:blank', title: 'Error', status: 0, detail: String(e) }));
    } finally {
      setBusy(false);
      setUpload(null);
    }
  };

  const columnOptions = (required: boolean) => [{ value: '', label: required ? '— choose a column —' : '— not in this file —' }, ...(preview?.header ?? []).map((h) => ({ value: h, label: h }))];
  const mappedIndex = new Map(FIELDS.map((f) => [preview?.header.indexOf(mapping[f.key] ?? '') ?? -1, f.label]));

  return (
    <div className="flex flex-col gap-3" aria-label="Tester CSV import">
      <div
        {...dz.getRootProps({
          className: `flex cursor-pointer flex-col items-center justify-center rounded-lg border-2 border-dashed px-4 py-6 text-center text-sm ${dz.isDragActive ? 'border-copper bg-copper-light' : 'border-rule bg-paper hover:border-copper'}`,
        })}
      >
        <input {...dz.getInputProps({ 'aria-label': 'Tester CSV file' })} />
        <p className="font-semibold text-ink">{dz.isDragActive ? 'Drop the file here' : 'Drop a tester CSV here, or press to choose a file'}</p>
        <p className="text-ink-faint">The first line must name the columns. Readings go into session #{session.id} ({session.instrument}, {session.ambientC} °C).</p>
      </div>
      {readError && <Notice tone="fail">{readError}</Notice>}

      {preview && (
        <>
          <ScrollBox label="Preview of the first rows" className="rounded-md border border-rule">
            <table className="w-full border-collapse text-sm" aria-label="Preview of the first rows">
              <caption className="bg-paper px-2 py-1 text-left text-xs text-ink-soft">
                {preview.file.name} · {(preview.file.size / 1024).toFixed(0)} kB · first {preview.rows.length} rows
              </caption>
              <thead>
                <tr>
                  {preview.header.map((h, i) => (
                    <th key={`${h}-${i}`} className={`border-b border-rule px-2 py-1 text-left text-xs font-bold ${mappedIndex.has(i) ? 'bg-copper-light text-ink' : 'text-ink-faint'}`}>
                      {h}
                      {mappedIndex.has(i) && <span className="ml-1 font-normal text-copper-dark">→ {mappedIndex.get(i)}</span>}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {preview.rows.map((r, ri) => (
                  <tr key={ri}>
                    {preview.header.map((_, ci) => (
                      <td key={ci} className={`num px-2 py-0.5 ${mappedIndex.has(ci) ? 'text-ink' : 'text-ink-faint'}`}>
                        {r[ci]}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollBox>
          <div className="grid gap-3 sm:grid-cols-5">
            {FIELDS.map((f) => (
              <SelectField
                key={f.key}
                label={`${f.label}${f.required ? '' : ' (optional)'}`}
                value={mapping[f.key] ?? ''}
                onChange={(e) => setMapping({ ...mapping, [f.key]: e.target.value || (f.required ? '' : null) })}
                options={columnOptions(f.required)}
                error={error?.fieldError(`mapping.${f.key}`)}
              />
            ))}
          </div>
          <div className="grid gap-3 sm:grid-cols-3">
            <SelectField label="Vbe unit" value={units.vbe} onChange={(e) => setUnits({ ...units, vbe: e.target.value as VoltageUnit })} options={[{ value: 'mV', label: 'mV' }, { value: 'V', label: 'V' }]} />
            <SelectField label="VCE(sat) unit" value={units.vceSat} onChange={(e) => setUnits({ ...units, vceSat: e.target.value as VoltageUnit })} options={[{ value: 'mV', label: 'mV' }, { value: 'V', label: 'V' }]} />
            <SelectField label="Leakage unit" value={units.leakage} onChange={(e) => setUnits({ ...units, leakage: e.target.value as CurrentUnit })} options={[{ value: 'nA', label: 'nA' }, { value: 'uA', label: 'µA' }]} />
          </div>
          <div className="flex flex-wrap items-center gap-3">
            <Button variant="primary" onClick={() => void run()} busy={busy} disabled={missing.length > 0}>
              Import {preview.file.name}
            </Button>
            <Button variant="quiet" onClick={() => setPreview(null)} disabled={busy}>
              Cancel
            </Button>
            {missing.length > 0 && <span className="text-sm text-hold">Map a column to {missing.join(', ')}.</span>}
            {remembered.data && <span className="text-xs text-ink-faint">Mapping of {session.instrument} remembered from {new Date(remembered.data.updatedAt).toLocaleDateString()}.</span>}
          </div>
        </>
      )}

      {busy && (
        <div className="grid gap-1 text-sm" aria-live="polite" data-testid="import-progress">
          <div className="flex justify-between">
            <span>{upload !== null && upload < 1 ? `Uploading… ${Math.round(upload * 100)} %` : (phase?.message ?? 'Waiting for the server…')}</span>
            {phase && phase.total > 0 && <span className="num text-ink-soft">{Math.round((100 * phase.done) / phase.total)} %</span>}
          </div>
          <div className="h-2 overflow-hidden rounded bg-paper" role="progressbar" aria-label="Import progress" aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(100 * (upload ?? 0))}>
            <div className="h-full bg-copper transition-all" style={{ width: `${upload !== null && upload < 1 ? 100 * upload : phase && phase.total ? (100 * phase.done) / phase.total : 100}%` }} />
          </div>
        </div>
      )}
      {result && (
        <Notice tone="pass" title="Import complete">
          {result.imported.toLocaleString()} readings imported into session #{result.sessionId} in {(result.ms / 1000).toFixed(1)} s.
        </Notice>
      )}
      {error && (
        <Notice tone="fail" title={error.status === 422 ? 'Nothing was imported' : 'The import failed'}>
          <p>{error.problem.detail}</p>
          {error.problem.errors && error.problem.errors.length > 0 && (
            <ul className="mt-1 max-h-48 list-disc overflow-y-auto pl-5" data-testid="import-errors">
              {error.problem.errors.slice(0, MAX_LISTED).map((e) => (
                <li key={`${e.field}-${e.message}`}>
                  <span className="font-semibold">{e.field}</span>: {e.message}
                </li>
              ))}
              {error.problem.errors.length > MAX_LISTED && <li>… and {error.problem.errors.length - MAX_LISTED} more listed by the server.</li>}
            </ul>
          )}
        </Notice>
      )}
    </div>
  );
}
