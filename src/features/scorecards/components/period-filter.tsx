import { useState } from 'react';
import type { ScorecardPeriod } from '../../../../shared/api/supplier-quality.ts';
import { Button } from '../../../components/ui/button.tsx';

const control = 'rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink';

/** From–to dates (inclusive) of the scorecard period; applied with the button or Enter. */
export function PeriodFilter({ value, onChange }: { value: ScorecardPeriod; onChange: (p: ScorecardPeriod) => void }) {
  const [from, setFrom] = useState(value.from);
  const [to, setTo] = useState(value.to);
  const invalid = !from || !to || from > to;
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      aria-label="Scorecard period"
      onSubmit={(e) => {
        e.preventDefault();
        if (!invalid) onChange({ from, to });
      }}
    >
      <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
        Received from
        <input type="date" value={from} onChange={(e) => setFrom(e.target.value)} className={control} />
      </label>
      <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
        to
        <input type="date" value={to} onChange={(e) => setTo(e.target.value)} className={control} />
      </label>
      <Button type="submit" disabled={invalid}>
        Apply period
      </Button>
      {invalid && <p className="text-xs font-semibold text-fail" role="alert">✕ The start must not lie after the end.</p>}
    </form>
  );
}
