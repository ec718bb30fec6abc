import { useRef, useState } from 'react';
import type { BinSchemeVersionRow, PartTypeRow } from '../../../../shared/api/catalog.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { EmptyState, Loading } from '../../../components/ui/page.tsx';
import { useBinSchemes } from '../api/get-bin-schemes.ts';
import { BinSchemeEditor } from './bin-scheme-editor.tsx';
import { BinSchemeHistory, LockBadge } from './bin-scheme-history.tsx';
import { BinStrip } from './bin-strip.tsx';

function CurrentBins({ version, part }: { version: BinSchemeVersionRow; part: PartTypeRow }) {
  return (
    <div className="flex flex-col gap-2">
      <div className="flex items-center gap-2 text-sm">
        <span className="font-semibold">Version {version.version}</span>
        <LockBadge version={version} />
      </div>
      <BinStrip bins={version.bins} limits={part} />
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Bins of the current scheme version</caption>
        <thead className="bg-paper text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-2 py-1.5">Code</th>
            <th scope="col" className="px-2 py-1.5">Label</th>
            <th scope="col" className="px-2 py-1.5 text-right normal-case">hFE min</th>
            <th scope="col" className="px-2 py-1.5 text-right normal-case">hFE max</th>
            <th scope="col" className="px-2 py-1.5 normal-case">Vbe window (mV)</th>
          </tr>
        </thead>
        <tbody>
          {version.bins.map((b) => (
            <tr key={b.id} className="border-b border-rule/70">
              <td className="px-2 py-1 font-bold">{b.code}</td>
              <td className="px-2 py-1">{b.label}</td>
              <td className="num px-2 py-1 text-right">{b.hfeMin}</td>
              <td className="num px-2 py-1 text-right">{b.hfeMax}</td>
              <td className="num px-2 py-1">{b.vbeMinMv === null && b.vbeMaxMv === null ? '—' : `${b.vbeMinMv ?? '…'} to ${b.vbeMaxMv ?? '…'}`}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** The part type's gain-bin schemes: the editor (quality engineers) or the current bins, and the version history. */
export function BinSchemePanel({ part, canEdit }: { part: PartTypeRow; canEdit: boolean }) {
  const q = useBinSchemes(part.id);
  const [baseId, setBaseId] = useState<number | null>(null);
  const [editorKey, setEditorKey] = useState(0);
  const [message, setMessage] = useState<string | null>(null);
  const editorRef = useRef<HTMLDivElement>(null);

  if (q.isLoading) return <Loading label="Loading gain-bin schemes…" />;
  if (q.isError) return <Notice tone="fail" title="The gain-bin schemes could not be loaded">{(q.error as Error).message}</Notice>;
  const versions = q.data ?? [];
  const current = versions[0] ?? null;
  const base = versions.find((v) => v.id === baseId) ?? current;

  const onSaved = async (row: BinSchemeVersionRow) => {
    setMessage(row.current && row.version === (current?.version ?? 0) + 1 ? `Saved as version ${row.version}; new lots use it.` : `Version ${row.version} saved.`);
    await q.refetch();
    setBaseId(null);
    setEditorKey((k) => k + 1);
  };

  return (
    <div className="grid grid-cols-1 gap-5 xl:grid-cols-[minmax(0,1fr)_22rem]">
      <div ref={editorRef} className="flex flex-col gap-3">
        <Notice tone="info" title="Versions freeze once used">
          New lots are binned by the current (highest) version. A version a lot has used never changes: saving an edit of it
          creates the next version.
        </Notice>
        {message && (
          <Notice tone="pass" title="Scheme saved">
            {message}
          </Notice>
        )}
        {canEdit ? (
          <BinSchemeEditor
            key={`${base?.id ?? 'none'}-${editorKey}`}
            partTypeId={part.id}
            limits={{ hfeMin: part.hfeMin, hfeMax: part.hfeMax }}
            base={base}
            baseIsCurrent={base !== null && base.id === current?.id}
            onSaved={(row) => void onSaved(row)}
          />
        ) : current ? (
          <CurrentBins version={current} part={part} />
        ) : (
          <EmptyState title="No gain-bin scheme yet">A quality engineer defines the bins for this part type.</EmptyState>
        )}
      </div>
      <section aria-labelledby="scheme-history-title">
        <h3 id="scheme-history-title" className="mb-2 text-sm font-bold uppercase tracking-wide text-ink-soft">
          Version history
        </h3>
        {versions.length === 0 ? (
          <p className="text-sm text-ink-faint">No versions yet.</p>
        ) : (
          <BinSchemeHistory
            versions={versions}
            editingId={canEdit ? (base?.id ?? null) : null}
            onStartFrom={
              canEdit
                ? (v) => {
                    setMessage(null);
                    setBaseId(v.id);
                    setEditorKey((k) => k + 1);
                    editorRef.current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
                  }
                : undefined
            }
          />
        )}
      </section>
    </div>
  );
}
