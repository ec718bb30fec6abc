import { useEffect, useRef, type KeyboardEvent } from 'react';
import { Button } from '../../../components/ui/button.tsx';

/**
 * The scan field. It has focus on arrival and is uncontrolled, so a keyboard-wedge scanner can
 * type a whole message at full speed; Enter (which scanners send last) reads it. Separator
 * substitutes such as <GS> or ^] are typed as text and handled by the server.
 */
export function ScanField({ onScan, busy }: { onScan: (text: string) => void; busy?: boolean }) {
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => {
    ref.current?.focus();
  }, []);

  const read = () => {
    const el = ref.current;
    if (!el || el.value.trim() === '') return;
    onScan(el.value);
    // Selected, so the next scan replaces it.
    el.select();
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'Enter') {
      e.preventDefault();
      read();
    }
  };

  return (
    <div className="flex flex-col gap-1">
      <label htmlFor="scan-field" className="text-sm font-semibold text-ink-soft">
        Scan a supplier label, or type a lot code or PO number
      </label>
      <div className="flex gap-2">
        <input
          id="scan-field"
          ref={ref}
          type="text"
          autoComplete="off"
          autoCorrect="off"
          autoCapitalize="off"
          spellCheck={false}
          onKeyDown={onKeyDown}
          aria-describedby="scan-hint"
          placeholder="[)>… or L-20260105-0001"
          className="w-full rounded-md border-2 border-copper bg-panel px-3 py-2 font-mono text-base text-ink placeholder:text-ink-faint focus:outline-none focus:ring-2 focus:ring-copper/40"
        />
        <Button type="button" variant="primary" busy={busy} onClick={read}>
          Read
        </Button>
      </div>
      <p id="scan-hint" className="text-xs text-ink-faint">
        2D labels (ISO/IEC 15434 format 06) and plain barcodes. Scanners that cannot send separators may send &lt;GS&gt;, &lt;RS&gt;, &lt;EOT&gt; or ^] ^^ ^D.
      </p>
    </div>
  );
}
