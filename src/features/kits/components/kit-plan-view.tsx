import type { Ref } from 'react';
import type { KitPartLine, KitPlan, KitSetView } from '../../../../shared/api/pairing.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { fixed, modeText, setsText } from './format.ts';
import { MismatchFootnote, MismatchMeaningText } from './mismatch-meaning.tsx';

/** The sets of a plan or kit with their spreads and what they mean in a circuit. */
export function SetsTable({ sets, caption }: { sets: KitSetView[]; caption: string }) {
  return (
    <ScrollBox label={caption} className="rounded-lg border border-rule bg-panel">
      {/* At least 44rem wide: on a phone the sets scroll sideways instead of breaking codes over lines. */}
      <table className="w-full min-w-[44rem] border-collapse text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2">
              Set
            </th>
            <th scope="col" className="px-3 py-2">
              Parts (container / position)
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              hFE spread
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              ΔVbe
            </th>
            <th scope="col" className="px-3 py-2">
              In a circuit
            </th>
          </tr>
        </thead>
        <tbody>
          {sets.map((s) => (
            <tr key={s.index} className="border-t border-rule/70 align-top">
              <td className="num px-3 py-1.5 font-semibold">{s.index}</td>
              <td className="px-3 py-1.5">
                <ul className="flex flex-col gap-0.5">
                  {s.parts.map((p) => (
                    <li key={`${p.containerCode}/${p.position}/${p.measurementId}`} className={p.releasedAt ? 'text-ink-faint line-through' : ''}>
                      <span className="whitespace-nowrap font-mono">
                        {p.containerCode}/{p.position}
                      </span>{' '}
                      <span className="num text-ink-soft">
                        {p.polarity} hFE {fixed(p.hfe25, 1)} · {fixed(p.vbeMv25, 1)} mV
                      </span>
                    </li>
                  ))}
                </ul>
              </td>
              <td className="num px-3 py-1.5 text-right">{fixed(s.hfeSpreadPct, 2)} %</td>
              <td className="num px-3 py-1.5 text-right">{fixed(s.vbeSpreadMv, 2)} mV</td>
              <td className="px-3 py-1.5">
                <MismatchMeaningText meaning={s.meaning} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollBox>
  );
}

/** Where to pull from: the planned parts in storage order, grouped by location and container. */
export function PlannedPickList({ lines }: { lines: KitPartLine[] }) {
  const groups: { location: string; containerCode: string; positions: KitPartLine[] }[] = [];
  for (const l of lines) {
    const last = groups[groups.length - 1];
    if (last && last.location === l.location && last.containerCode === l.containerCode) last.positions.push(l);
    else groups.push({ location: l.location, containerCode: l.containerCode, positions: [l] });
  }
  return (
    <ol aria-label="Containers and positions to pull" className="flex flex-col gap-1 text-sm">
      {groups.map((g) => (
        <li key={`${g.location}/${g.containerCode}`} className="flex flex-wrap items-baseline gap-x-2 rounded border border-rule bg-paper px-2 py-1">
          <span className="font-semibold">{g.location}</span>
          <span className="font-mono">{g.containerCode}</span>
          <span className="text-ink-soft">
            position{g.positions.length > 1 ? 's' : ''} {g.positions.map((p) => p.position).join(', ')}
          </span>
          <span className="text-xs text-ink-faint">
            lot {g.positions[0]?.lotCode}
            {g.positions[0]?.supplierLot ? ` · supplier lot ${g.positions[0].supplierLot}` : ''}
          </span>
        </li>
      ))}
    </ol>
  );
}

/**
 * A plan: how many sets the stock makes, the planned sets with their meaning, and where to pull.
 * `resultRef` gets the headline ("6 pairs possible"), which can take the focus once planned.
 */
export function KitPlanView({ plan, resultRef }: { plan: KitPlan; resultRef?: Ref<HTMLParagraphElement> }) {
  const short = plan.setsPossible < plan.setsWanted;
  return (
    <section aria-label="Plan" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-baseline gap-x-6 gap-y-1">
        <p ref={resultRef} tabIndex={-1} className="text-2xl font-bold text-ink" data-testid="sets-possible">
          {setsText(plan.setsPossible, plan.setSize)} possible
        </p>
        <p className="text-sm text-ink-soft">
          from {plan.stockParts} parts in stock of {plan.partTypes.map((p) => p.partNumber).join(' + ')} ({modeText(plan.mode)}), hFE within {fixed(plan.hfeTolerancePct, 1)} %, Vbe within{' '}
          {fixed(plan.vbeToleranceMv, 2)} mV
        </p>
      </div>
      {plan.setsPossible === 0 ? (
        <Notice tone="hold" title="No set can be made at these tolerances">
          Widen the tolerances, or screen more parts of this type into positioned containers.
        </Notice>
      ) : short ? (
        <Notice tone="hold" title={`Only ${plan.setsPossible} of the ${plan.setsWanted} sets wanted`}>
          The plan below shows all {plan.setsPossible}. A reservation is whole or refused: reserve {plan.setsPossible}, or widen the tolerances.
        </Notice>
      ) : (
        <Notice tone="info" title={`Planned: the ${plan.setsPlanned} best ${plan.setSize === 2 ? 'pairs' : 'quads'} from ${plan.containers} container${plan.containers === 1 ? '' : 's'}`}>
          Sets with the smallest mismatch first. Reserving plans again from the stock as it is at that moment.
        </Notice>
      )}
      {!plan.optimal && plan.upperBound !== null && (
        <Notice tone="info" title="Quads by a stated heuristic">
          {plan.method}. At most {plan.upperBound} sets are possible; the plan found {plan.setsPossible}.
        </Notice>
      )}
      {plan.sets.length > 0 && (
        <>
          <SetsTable sets={plan.sets} caption="Planned sets" />
          <MismatchFootnote vtMv={plan.sets[0]!.meaning.vtMv} />
          <h3 className="text-sm font-bold text-ink">Containers and positions to pull, in storage order</h3>
          <PlannedPickList lines={plan.pickList} />
        </>
      )}
      <p className="text-xs text-ink-faint">Method: {plan.method}.</p>
    </section>
  );
}
