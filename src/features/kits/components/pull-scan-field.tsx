import { useEffect, useRef, useState, type KeyboardEvent } from 'react';
import type { KitDetail, PullKitPartResponse } from '../../../../shared/api/pairing.ts';
import { readPickScan } from '../../../../shared/domain/kitting/index.ts';
import { CONTAINER_CODE_FORMAT } from '../../../../shared/domain/labels/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { usePullKitPart } from '../api/pull-kit-part.ts';

const input =
  'w-full rounded-md border-2 bg-panel px-3 py-2 font-mono text-lg text-ink placeholder:text-ink-faint focus:outline-none focus:ring-2 focus:ring-copper aria-[invalid=true]:border-fail';

/**
 * Pull by scanning: the container code (a scanner types it and Enter), then the position (typed
 * or scanned, Enter). A scan that carries the position too ("C-…/7") pulls at once. Focus starts
 * in the scan field and returns there after each pull; a refused scan says why and selects the
 * field at fault.
 */
export function PullScanField({ kit, onPulled }: { kit: KitDetail; onPulled?: (r: PullKitPartResponse) => void }) {
  const scanRef = useRef<HTMLInputElement>(null);
  const posRef = useRef<HTMLInputElement>(null);
  const [container, setContainer] = useState<string | null>(null);
  const [message, setMessage] = useState<{ tone: 'pass' | 'fail'; title: string; text: string } | null>(null);
  const [badField, setBadField] = useState<'containerCode' | 'position' | null>(null);
  const pull = usePullKitPart();

  useEffect(() => {
    scanRef.current?.focus();
  }, []);

  const send = (containerCode: string, position: number) => {
    setBadField(null);
    pull.mutate(
      { id: kit.id, body: { containerCode, position } },
      {
        onSuccess: (r) => {
          setMessage({
            tone: 'pass',
            title: `Pulled ${r.pulled.containerCode} position ${r.pulled.position} (set ${r.pulled.setIndex})`,
            text: `${r.progress}${r.kit.status === 'pulled' ? ' — the kit is complete.' : '.'}`,
          });
          setContainer(null);
          if (scanRef.current) scanRef.current.value = '';
          if (posRef.current) posRef.current.value = '';
          scanRef.current?.focus();
          onPulled?.(r);
        },
        onError: (e) => {
          const field = e instanceof ApiError ? (e.problem.errors?.[0]?.field as 'containerCode' | 'position' | undefined) : undefined;
          setMessage({ tone: 'fail', title: 'Not pulled', text: e instanceof ApiError ? e.problem.detail : 'The pull could not be recorded.' });
          setBadField(field ?? null);
          const target = field === 'position' ? posRef.current : scanRef.current;
          target?.focus();
          target?.select();
        },
      },
    );
  };

  const readScan = () => {
    const text = scanRef.current?.value ?? '';
    if (!text.trim()) return;
    const scan = readPickScan(text);
    if (!scan) {
      setMessage({ tone: 'fail', title: 'Not a container code', text: `"${text.trim().slice(0, 40)}" is not a container code (${CONTAINER_CODE_FORMAT}). Scan the label on the container.` });
      setBadField('containerCode');
      scanRef.current?.select();
      return;
    }
    if (scanRef.current) scanRef.current.value = scan.containerCode;
    if (scan.position !== null) {
      send(scan.containerCode, scan.position);
      return;
    }
    setContainer(scan.containerCode);
    setMessage(null);
    setBadField(null);
    posRef.current?.focus();
    posRef.current?.select();
  };

  const readPosition = () => {
    const code = container ?? readPickScan(scanRef.current?.value ?? '')?.containerCode ?? null;
    if (!code) {
      scanRef.current?.focus();
      return;
    }
    const raw = posRef.current?.value.trim() ?? '';
    const position = Number(raw);
    if (!/^\d{1,6}$/.test(raw) || position < 1) {
      setMessage({ tone: 'fail', title: 'Position needed', text: 'Type or scan the position number of the part in the container (1, 2, 3 …).' });
      setBadField('position');
      posRef.current?.select();
      return;
    }
    send(code, position);
  };

  const isEnter = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key !== 'Enter') return false;
    e.preventDefault();
    return true;
  };

  return (
    <div className="flex flex-col gap-2" role="group" aria-label="Pull by scanning">
      <div className="grid gap-3 sm:grid-cols-[1fr_10rem_auto] sm:items-end">
        <div className="flex flex-col gap-1">
          <label htmlFor="pull-scan" className="text-sm font-semibold text-ink-soft">
            Scan the container
          </label>
          <input
            id="pull-scan"
            ref={scanRef}
            type="text"
            autoComplete="off"
            autoCorrect="off"
            autoCapitalize="off"
            spellCheck={false}
            onKeyDown={(e) => {
              if (isEnter(e)) readScan();
            }}
            onChange={() => setContainer(null)}
            placeholder="C-20260105-0001"
            aria-invalid={badField === 'containerCode' || undefined}
            aria-describedby="pull-message"
            className={`${input} border-copper`}
          />
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="pull-position" className="text-sm font-semibold text-ink-soft">
            Position
          </label>
          <input
            id="pull-position"
            ref={posRef}
            type="text"
            inputMode="numeric"
            autoComplete="off"
            onKeyDown={(e) => {
              if (isEnter(e)) readPosition();
            }}
            placeholder="7"
            aria-invalid={badField === 'position' || undefined}
            aria-describedby="pull-message"
            className={`${input} border-rule`}
          />
        </div>
        <Button type="button" variant="primary" busy={pull.isPending} onClick={() => (container || readPickScan(scanRef.current?.value ?? '') ? readPosition() : readScan())}>
          Pull
        </Button>
      </div>
      <p className="text-xs text-ink-faint">
        {container ? `Container ${container} read — now the position.` : 'A scanner sends Enter after the code; a label that carries the position as well ("C-…/7") pulls at once.'}
      </p>
      <div id="pull-message" aria-live="polite">
        {message && (
          <Notice tone={message.tone} title={message.title}>
            {message.text}
          </Notice>
        )}
      </div>
    </div>
  );
}
