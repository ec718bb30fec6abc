import type { ReactNode } from 'react';

type Tone = 'pass' | 'fail' | 'hold' | 'info';

const tones: Record<Tone, { box: string; mark: string; word: string }> = {
  pass: { box: 'border-pass bg-pass-light text-pass', mark: '✓', word: 'Done' },
  fail: { box: 'border-fail bg-fail-light text-fail', mark: '✕', word: 'Error' },
  hold: { box: 'border-hold bg-hold-light text-hold', mark: '!', word: 'Caution' },
  info: { box: 'border-info bg-info-light text-info', mark: 'i', word: 'Note' },
};

/** A message box. Tone is carried by a mark and a word as well as colour. */
export function Notice({ tone, title, children }: { tone: Tone; title?: string; children?: ReactNode }) {
  const t = tones[tone];
  return (
    <div role={tone === 'fail' ? 'alert' : 'status'} className={`flex gap-3 rounded-md border-l-4 px-3 py-2 text-sm ${t.box}`}>
      <span aria-hidden className="mt-0.5 inline-flex h-5 w-5 shrink-0 items-center justify-center rounded-full border border-current text-xs font-bold">
        {t.mark}
      </span>
      <div className="text-ink">
        <p className="font-semibold">{title ?? t.word}</p>
        {children && <div className="text-ink-soft">{children}</div>}
      </div>
    </div>
  );
}

/** A small status tag: mark + word, colour only as a second signal. */
export function StatusTag({ tone, children }: { tone: Tone | 'neutral'; children: ReactNode }) {
  const cls =
    tone === 'neutral' ? 'border-rule bg-paper text-ink-soft' : `${tones[tone].box.replace('border-l-4', '')} border`;
  const mark = tone === 'neutral' ? '•' : tones[tone].mark;
  return (
    <span className={`inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-semibold ${cls}`}>
      <span aria-hidden>{mark}</span>
      {children}
    </span>
  );
}
