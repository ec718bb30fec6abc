import { useEffect, useRef, useState, type KeyboardEvent } from 'react';
import type { ContainerDetail } from '../../../../shared/api/bins.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { getContainerByCode } from '../api/get-container-by-code.ts';

/**
 * A scan field for container codes with focus on arrival; uncontrolled so a keyboard-wedge
 * scanner can type at full speed, Enter reads. A found container is handed to `onFound`.
 */
export function ScanContainerField({ onFound }: { onFound: (c: ContainerDetail) => void }) {
  const ref = useRef<HTMLInputElement>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    ref.current?.focus();
  }, []);

  const read = async () => {
    const el = ref.current;
    const text = el?.value.trim() ?? '';
    if (!el || text === '') return;
    setBusy(true);
    setError(null);
    try {
      onFound(await getContainerByCode(text));
    } catch (e) {
      setError(e instanceof ApiError ? e.problem.detail : 'The container could not be looked up.');
      el.select();
    } finally {
      setBusy(false);
    }
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'Enter') {
      e.preventDefault();
      void read();
    }
  };

  return (
    <div className="flex flex-col gap-1">
      <label htmlFor="container-scan" className="text-sm font-semibold text-ink-soft">
        Scan or type a container code
      </label>
      <div className="flex gap-2">
        <input
          id="container-scan"
          ref={ref}
          type="text"
          autoComplete="off"
          autoCorrect="off"
          autoCapitalize="off"
          spellCheck={false}
          onKeyDown={onKeyDown}
          placeholder="C-20260105-0001"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? 'container-scan-error' : undefined}
          className="w-full rounded-md border-2 border-copper bg-panel px-3 py-2 font-mono text-base text-ink placeholder:text-ink-faint focus:outline-none focus:ring-2 focus:ring-copper/40"
        />
        <Button type="button" variant="primary" busy={busy} onClick={() => void read()}>
          Open
        </Button>
      </div>
      {error && (
        <div id="container-scan-error">
          <Notice tone="fail" title="No container opened">
            {error}
          </Notice>
        </div>
      )}
    </div>
  );
}
