import { useQueryClient } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { LotStatusTag } from '../../../features/bench-queue/components/bench-queue-table.tsx';
import { useLotScreening } from '../../../features/bins/api/get-lot-screening.ts';
import { binKeys } from '../../../features/bins/api/keys.ts';
import { LotScreeningPanel } from '../../../features/bins/components/lot-screening-panel.tsx';
import { ScreeningCallout } from '../../../features/bins/components/screening-callout.tsx';
import { dispositionKeys } from '../../../features/disposition/api/keys.ts';
import { DispositionPanel } from '../../../features/disposition/components/disposition-panel.tsx';
import { lotResultKeys } from '../../../features/lot-results/api/keys.ts';
import { LotSummaryPanel } from '../../../features/lot-results/components/lot-summary-panel.tsx';
import { measurementKeys } from '../../../features/measurements/api/keys.ts';
import { MeasurementCapture } from '../../../features/measurements/components/measurement-capture.tsx';
import { MeasurementsTable } from '../../../features/measurements/components/measurements-table.tsx';
import { useLotPlan } from '../../../features/sampling/api/get-lot-plan.ts';
import { samplingKeys } from '../../../features/sampling/api/keys.ts';
import { LotPlanPanel } from '../../../features/sampling/components/lot-plan-panel.tsx';
import { RequireArea } from '../require-area.tsx';
import { useSessionUser } from '../use-session-user.ts';

const FINAL = ['accepted', 'rejected', 'mrb'];

/** /bench/lots/:id — plan, capture, results and disposition of one lot. */
export function BenchLotPage() {
  const { id } = useParams();
  const lotId = Number(id);
  const user = useSessionUser();
  const qc = useQueryClient();
  const plan = useLotPlan(lotId);
  // What the bench may still record once the disposition is signed (screening after MRB "100 % screen").
  const screening = useLotScreening(lotId);

  // Any reading or decision changes the plan progress, the statistics, the table and the recommendation.
  const refreshLot = () => {
    void qc.invalidateQueries({ queryKey: samplingKeys.lotPlan(lotId) });
    void qc.invalidateQueries({ queryKey: measurementKeys.lot(lotId) });
    void qc.invalidateQueries({ queryKey: lotResultKeys.lot(lotId) });
    void qc.invalidateQueries({ queryKey: dispositionKeys.lot(lotId) });
    void qc.invalidateQueries({ queryKey: binKeys.lot(lotId) });
  };

  if (!Number.isSafeInteger(lotId) || lotId < 1) return <Notice tone="fail" title="No such lot">The address does not name a lot.</Notice>;

  return (
    <RequireArea area="bench">
      {plan.isLoading ? (
        <Loading label="Loading the lot…" />
      ) : plan.isError || !plan.data ? (
        <Notice tone="fail" title="The lot could not be loaded">
          {(plan.error as Error | null)?.message}{' '}
          <Link to="/bench" className="font-semibold underline">
            Back to the bench queue
          </Link>
        </Notice>
      ) : (
        (() => {
          const { lot, partType } = plan.data;
          const closed = FINAL.includes(lot.status);
          const screenOnly = closed && screening.data?.benchWork === 'screen-only';
          return (
            <>
              <PageHeader
                title={`${lot.code} — ${partType.partNumber}`}
                subtitle={
                  <span className="flex flex-wrap items-center gap-2">
                    <LotStatusTag status={lot.status} />
                    {partType.polarity} {partType.description} · {lot.quantity.toLocaleString()} parts from {lot.supplierName}
                    {lot.dateCode ? ` · date code ${lot.dateCode}` : ''} · hFE {partType.hfeMin ?? 'open'}–{partType.hfeMax ?? 'open'} at IC {partType.hfeIcMa} mA, VCE {partType.hfeVceV} V · Vbe {partType.vbeMinMv ?? 'open'}–
                    {partType.vbeMaxMv ?? 'open'} mV
                  </span>
                }
                actions={
                  <>
                    <a href={`/api/lots/${lot.id}/measurements.csv`} className="inline-flex items-center rounded-md border border-rule bg-panel px-3 py-1.5 text-sm font-semibold text-ink hover:bg-paper" download>
                      Readings CSV
                    </a>
                    <a href={`/api/lots/${lot.id}/report.pdf`} target="_blank" rel="noreferrer" className="inline-flex items-center rounded-md border border-copper-dark bg-copper px-3 py-1.5 text-sm font-semibold text-white hover:bg-copper-dark">
                      Inspection report (PDF)
                    </a>
                  </>
                }
              />
              <div className="mb-4">
                <Notice tone="hold" title="Handle at an ESD-protected workstation">
                  Wear a grounded wrist strap and keep parts in ESD-safe packaging (ANSI/ESD S20.20).{' '}
                  {partType.esdHbmClass ? `This part is HBM class ${partType.esdHbmClass}.` : 'The ESD class of this part is not recorded.'} Test fixtures and curve tracers can apply
                  dangerous voltages: follow your bench's procedures and local rules.
                </Notice>
              </div>
              <div className="grid grid-cols-1 gap-5 xl:grid-cols-[minmax(0,1fr)_26rem]">
                <div className="flex min-w-0 flex-col gap-5">
                  <Panel title="Measure">
                    <ScreeningCallout lotId={lot.id} containerHref={(cid) => `/bins/containers/${cid}`} />
                    <MeasurementCapture
                      lotId={lot.id}
                      userId={user.id}
                      part={{ ...partType }}
                      quantity={lot.quantity}
                      closed={closed}
                      screenOnly={screenOnly}
                      onChanged={refreshLot}
                    />
                  </Panel>
                  <LotSummaryPanel lotId={lot.id} />
                  <Panel title="Readings">
                    <MeasurementsTable lotId={lot.id} limits={partType} />
                  </Panel>
                </div>
                <div className="flex flex-col gap-5">
                  <LotPlanPanel data={plan.data} canRecordCorrectiveAction={user.role === 'quality'} />
                  <DispositionPanel lotId={lot.id} role={user.role} onChanged={refreshLot} />
                  <LotScreeningPanel lotId={lot.id} canEdit={user.role === 'inspector' || user.role === 'quality'} containerHref={(cid) => `/bins/containers/${cid}`} />
                </div>
              </div>
            </>
          );
        })()
      )}
    </RequireArea>
  );
}
