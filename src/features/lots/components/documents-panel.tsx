import { useState } from 'react';
import { useDropzone, type FileRejection } from 'react-dropzone';
import { DOCUMENT_ACCEPTED, DOCUMENT_KINDS, DOCUMENT_KIND_LABELS, DOCUMENT_MAX_BYTES, type DocumentKind, type LotDetail } from '../../../../shared/api/lots.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { EmptyState, Panel } from '../../../components/ui/page.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useUploadDocument } from '../api/upload-document.ts';
import { formatDateTime } from './format.ts';

interface Upload {
  key: string;
  name: string;
  progress: number;
  state: 'uploading' | 'done' | 'error';
  message?: string;
}

const MB = 1024 * 1024;

function size(bytes: number): string {
  return bytes >= MB ? `${(bytes / MB).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

/** Drop certificates, photos and test reports onto the lot; the server checks each file's content. */
export function DocumentsPanel({ lot, canUpload }: { lot: LotDetail; canUpload: boolean }) {
  const [kind, setKind] = useState<DocumentKind>('coc');
  const [uploads, setUploads] = useState<Upload[]>([]);
  const upload = useUploadDocument();
  const patch = (key: string, change: Partial<Upload>) => setUploads((list) => list.map((u) => (u.key === key ? { ...u, ...change } : u)));

  const onDrop = async (accepted: File[], rejected: FileRejection[]) => {
    const stamp = Date.now();
    const refused = rejected.map((r, i) => ({
      key: `${stamp}-r${i}`,
      name: r.file.name,
      progress: 0,
      state: 'error' as const,
      message: r.errors.some((e) => e.code === 'file-too-large') ? `larger than ${DOCUMENT_MAX_BYTES / MB} MB; nothing was sent` : r.errors.map((e) => e.message).join('; '),
    }));
    const queued = accepted.map((f, i) => ({ key: `${stamp}-a${i}`, name: f.name, progress: 0, state: 'uploading' as const }));
    setUploads((list) => [...queued, ...refused, ...list].slice(0, 12));
    // One at a time, so the progress bars mean something on a slow line.
    for (const [i, file] of accepted.entries()) {
      const key = queued[i].key;
      try {
        await upload.mutateAsync({ lotId: lot.id, file, kind, onProgress: (p) => patch(key, { progress: p }) });
        patch(key, { state: 'done', progress: 1 });
      } catch (e) {
        patch(key, { state: 'error', message: e instanceof ApiError ? e.problem.detail : (e as Error).message });
      }
    }
  };

  const { getRootProps, getInputProps, isDragActive } = useDropzone({ onDrop, maxSize: DOCUMENT_MAX_BYTES, disabled: !canUpload });

  return (
    <Panel title="Documents">
      <div className="flex flex-col gap-3">
        {canUpload && (
          <>
            <label className="flex w-64 flex-col gap-1 text-sm font-semibold text-ink-soft">
              Kind of the next files
              <select value={kind} onChange={(e) => setKind(e.target.value as DocumentKind)} className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink">
                {DOCUMENT_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {DOCUMENT_KIND_LABELS[k]}
                  </option>
                ))}
              </select>
            </label>
            <div
              {...getRootProps({
                'aria-label': 'Drop documents here or press Enter to choose files',
                'data-testid': 'document-dropzone',
              } as React.HTMLAttributes<HTMLElement>)}
              className={`cursor-pointer rounded-lg border-2 border-dashed px-4 py-6 text-center text-sm transition-colors ${
                isDragActive ? 'border-copper bg-copper-light' : 'border-rule bg-paper hover:border-copper'
              }`}
            >
              <input {...getInputProps()} />
              <p className="font-semibold text-ink">{isDragActive ? 'Drop to attach' : 'Drop files here, or click to choose'}</p>
              <p className="mt-1 text-xs text-ink-soft">
                {DOCUMENT_ACCEPTED}, up to {DOCUMENT_MAX_BYTES / MB} MB each. The type is read from the content, not the file name. Files are never replaced: the same file twice is refused.
              </p>
            </div>
          </>
        )}
        {uploads.length > 0 && (
          <ul className="flex flex-col gap-1.5" aria-label="Uploads">
            {uploads.map((u) => (
              <li key={u.key} className="text-sm">
                <div className="flex items-center justify-between gap-2">
                  <span className="truncate font-medium">{u.name}</span>
                  <span className={u.state === 'error' ? 'font-semibold text-fail' : u.state === 'done' ? 'font-semibold text-pass' : 'text-ink-soft'}>
                    {u.state === 'done' ? '✓ Attached' : u.state === 'error' ? '✕ Refused' : `${Math.round(u.progress * 100)} %`}
                  </span>
                </div>
                {u.state === 'uploading' && (
                  <progress className="h-1.5 w-full accent-copper" max={1} value={u.progress} aria-label={`Uploading ${u.name}`} />
                )}
                {u.message && (
                  <p className="text-xs text-fail" role="alert">
                    {u.message}
                  </p>
                )}
              </li>
            ))}
          </ul>
        )}
        {lot.documents.length === 0 ? (
          <EmptyState title="No documents yet">Attach the certificate of conformance and photos of the labels and packaging.</EmptyState>
        ) : (
          <ScrollBox label={`Documents of lot ${lot.code}`}>
            <table className="w-full text-sm">
              <caption className="sr-only">Documents of lot {lot.code}</caption>
              <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
                <tr>
                  <th scope="col" className="py-1 pr-3">File</th>
                  <th scope="col" className="py-1 pr-3">Kind</th>
                  <th scope="col" className="py-1 pr-3">Type</th>
                  <th scope="col" className="py-1 pr-3">Added</th>
                  <th scope="col" className="py-1">SHA-256</th>
                </tr>
              </thead>
              <tbody>
                {lot.documents.map((d) => (
                  <tr key={d.id} className="border-t border-rule/70 align-top">
                    <td className="py-1.5 pr-3">
                      <a href={d.contentUrl} className="font-semibold text-copper-dark underline-offset-2 hover:underline" download>
                        {d.originalName}
                      </a>
                      <span className="ml-1 text-xs text-ink-faint">{size(d.sizeBytes)}</span>
                    </td>
                    <td className="py-1.5 pr-3">{DOCUMENT_KIND_LABELS[d.kind]}</td>
                    <td className="py-1.5 pr-3 font-mono text-xs">{d.mediaType}</td>
                    <td className="py-1.5 pr-3 text-xs">
                      {formatDateTime(d.uploadedAt)}
                      <br />
                      {d.uploadedBy.name}
                    </td>
                    <td className="py-1.5 font-mono text-xs text-ink-soft" title={d.sha256}>
                      {d.sha256.slice(0, 12)}…
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollBox>
        )}
        {!canUpload && <Notice tone="info">Inspectors and quality engineers attach documents.</Notice>}
      </div>
    </Panel>
  );
}
