import type { ScorecardFigures } from '../../../../shared/api/supplier-quality.ts';
import { dppm, num, pct } from './format.ts';
import { SeverityTag } from './severity-tag.tsx';

/** The headline figures of a scorecard as a row of labelled values. */
export function FiguresStrip({ f }: { f: ScorecardFigures }) {
  const items: [string, React.ReactNode][] = [
    ['Lots received', <span className="num">{f.lotsReceived}</span>],
    ['Accepted / rejected / MRB', <span className="num">{`${f.accepted} / ${f.rejected} / ${f.mrb}`}</span>],
    ['Lot acceptance', <span className="num">{pct(f.acceptanceRate)}</span>],
    ['DPPM (sample)', <span className="num">{`${dppm(f.dppm)}${f.sampledParts ? ` (${f.sampledDefects} of ${f.sampledParts})` : ''}`}</span>],
    ['CoC on time', <span className="num">{`${pct(f.cocOnTimeRate)} (${f.cocOnTime} of ${f.lotsReceived})`}</span>],
    ['Mean hFE ± sd of lot means', f.meanHfe === null ? <span className="text-sm text-ink-faint">per part type below</span> : <span className="num">{`${num(f.meanHfe)} ± ${num(f.sdOfLotMeans)}`}</span>],
    ['Inspection', <SeverityTag severity={f.severity} />],
    ['Open alerts / NCRs', <span className="num">{`${f.openAlerts} / ${f.openNcrs}`}</span>],
  ];
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-2 sm:grid-cols-4">
      {items.map(([k, v]) => (
        <div key={k}>
          <dt className="text-xs font-semibold uppercase tracking-wide text-ink-faint">{k}</dt>
          <dd className="text-base text-ink">{v}</dd>
        </div>
      ))}
    </dl>
  );
}
