import { useState } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { EmptyState, Loading } from '../../../components/ui/page.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { SINK_PAGE_SIZE, useSinkMessages } from '../api/get-sink-messages.ts';

/** What the local SMTP sink received — proof of what left Binwright, with attachments. */
export function SinkMessages() {
  const [page, setPage] = useState(1);
  const q = useSinkMessages(page);
  if (q.isLoading) return <Loading />;
  if (q.isError) return <Notice tone="fail" title="The sink could not be read">{(q.error as Error).message}</Notice>;
  const data = q.data!;
  if (data.total === 0) return <EmptyState title="The local mail sink has received nothing yet" />;
  const pages = Math.max(1, Math.ceil(data.total / SINK_PAGE_SIZE));
  return (
    <div className="flex flex-col gap-2">
      <ul className="flex flex-col gap-2">
        {data.items.map((m) => (
          <li key={m.name} className="rounded-md border border-rule bg-panel p-3 text-sm">
            <details>
              <summary className="cursor-pointer">
                <span className="font-semibold">{m.subject || '(no subject)'}</span>{' '}
                <span className="text-ink-soft">to {m.to}</span>{' '}
                <span className="num text-xs text-ink-faint">{m.date ? new Date(m.date).toLocaleString() : ''}</span>
              </summary>
              <pre className="mt-2 whitespace-pre-wrap font-sans text-ink-soft">{m.text}</pre>
            </details>
            {m.attachments.length > 0 && (
              <p className="mt-1 text-xs">
                Attachments:{' '}
                {m.attachments.map((a) => (
                  <a key={a.index} className="mr-2 text-copper-dark underline" href={`/api/mail/sink/${encodeURIComponent(m.name)}/attachments/${a.index}`}>
                    {a.filename}
                  </a>
                ))}
              </p>
            )}
          </li>
        ))}
      </ul>
      <div className="flex items-center justify-end gap-2 text-xs text-ink-soft">
        <Button variant="quiet" disabled={page <= 1} onClick={() => setPage(page - 1)}>
          ‹ Newer
        </Button>
        <span className="num">
          Page {page} of {pages}
        </span>
        <Button variant="quiet" disabled={page >= pages} onClick={() => setPage(page + 1)}>
          Older ›
        </Button>
      </div>
    </div>
  );
}
