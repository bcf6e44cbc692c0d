import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { CurveNote } from '@/components/loadtest/load-test-panel';
import { PowerTorqueChart } from '@/components/loadtest/power-torque-chart';
import { PrintButton } from '@/components/loadtest/print-button';
import { BatteryFigures, ConditionsVerdict, conditionRows, DynoFigures, VerdictBadge } from '@/components/loadtest/run-figures';
import { Wordmark } from '@/components/shell/wordmark';
import { requireUser } from '@/lib/auth/session';
import { findClaimForUser } from '@/lib/db/claims';
import { formatDateTime } from '@/lib/format/dates';
import { LEGAL_CLASSES, POWER_TORQUE_TOLERANCE } from '@/lib/loadtest';
import { chartAxes } from '@/lib/loadtest-evidence';
import { loadTestView } from '@/lib/services/load-test-view';

export const metadata: Metadata = { title: 'Load-test report' };

/** A claim's load-test evidence on paper: chart, figures, conditions and verdict, for the claim's parties only. */
export default async function LoadTestReportPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requireUser();
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const claim = await findClaimForUser(user, id);
  if (!claim) notFound();
  const view = await loadTestView(user, claim, []);
  const { units, before, after, comparison, chart, runs } = view;
  const axes = chartAxes(units);
  const legalClass = before?.spec.kind === 'dyno' && before.spec.legalClass ? LEGAL_CLASSES[before.spec.legalClass] : null;

  return (
    <article className="space-y-6 text-ink" data-testid="load-test-report">
      <header className="flex items-start justify-between gap-4 border-b border-paper-line pb-4">
        <div>
          <Wordmark />
          <h1 className="mt-3">Load-test report</h1>
          <p className="text-sm text-ink-soft">
            Claim <span className="font-mono">{claim.number}</span>
            {claim.rmaNumber ? <> · RMA <span className="font-mono">{claim.rmaNumber}</span></> : null} · {claim.brandName} · {claim.dealerName}
          </p>
          <p className="text-sm text-ink-soft">
            {claim.partNumber ? `${claim.partNumber} ${claim.partName}` : 'Part not chosen'} · {claim.modelName ?? 'model not chosen'} · frame <span className="font-mono">{claim.frameSerial}</span>
          </p>
          <p className="text-xs text-ink-muted">Printed {formatDateTime(new Date(), user.timeZone)} by {user.name}; figures in {units} units.</p>
        </div>
        <PrintButton />
      </header>

      {!runs.length ? <p>No load test has been recorded on this claim.</p> : null}

      {chart && (chart.before || chart.after) ? (
        <section className="print-avoid-break">
          <h2 className="mb-2">Wheel power and torque against speed</h2>
          <PowerTorqueChart axes={axes} before={chart.before} after={chart.after} legalLimit={chart.legalLimit} legalLabel={legalClass ? `${legalClass.name} limit` : undefined} minPower={chart.minPower} width={720} height={340} />
          <CurveNote runs={[before, after]} units={units} className="mt-1" />
        </section>
      ) : null}

      {before || after ? (
        <section className="print-avoid-break">
          <h2 className="mb-2">Figures</h2>
          {(before ?? after)!.summary.kind === 'battery' ? (
            <BatteryFigures before={before?.summary.kind === 'battery' ? before.summary.analysis : null} after={after?.summary.kind === 'battery' ? after.summary.analysis : null} />
          ) : (
            <DynoFigures before={before?.summary.kind === 'dyno' ? before.summary[units] : null} after={after?.summary.kind === 'dyno' ? after.summary[units] : null} units={units} />
          )}
        </section>
      ) : null}

      {[before, after].map((run) =>
        run ? (
          <section key={run.id} className="print-avoid-break space-y-1">
            <h2 className="flex flex-wrap items-center gap-3">
              {run.phase === 'before' ? 'Before the repair' : 'After the repair'} <VerdictBadge verdict={run.verdict} />
            </h2>
            <p className="text-sm">{run.verdict.message}</p>
            {run.summary.kind === 'dyno' && run.summary[units].consistency ? <p className="text-sm">{run.summary[units].consistency!.message}</p> : null}
            {view.showLegalCheck && run.summary.kind === 'dyno' && run.summary[units].legal ? (
              <p className={`text-sm ${run.summary[units].legal!.possibleTampering ? 'font-bold text-volt-700' : ''}`}>
                {run.summary[units].legal!.possibleTampering ? 'Possible limiter tampering — check before deciding. ' : ''}
                {run.summary[units].legal!.message}
              </p>
            ) : null}
            <p className="text-xs text-ink-muted">
              File {run.fileName} (SHA-256 <span className="font-mono">{run.sha256.slice(0, 16)}…</span>), {run.sampleCount.toLocaleString('en')} samples, recorded {formatDateTime(run.createdAt, user.timeZone)} by {run.createdByName ?? 'the dealer'}.
            </p>
          </section>
        ) : null,
      )}

      {before || after ? (
        <section className="print-avoid-break">
          <h2 className="mb-2">Test conditions</h2>
          <table className="w-full text-sm">
            <thead>
              <tr className="text-left text-xs uppercase tracking-wide text-ink-muted">
                <th className="py-1">Condition</th>
                {before ? <th className="py-1">Before repair</th> : null}
                {after ? <th className="py-1">After repair</th> : null}
              </tr>
            </thead>
            <tbody>
              {conditionRows((before ?? after)!.conditions, units, view.kind).map((row, i) => (
                <tr key={row.label} className="border-t border-paper-line">
                  <td className="py-1 pr-3 text-ink-muted">{row.label}</td>
                  {before ? <td className="py-1 pr-3">{conditionRows(before.conditions, units, view.kind)[i]?.value}</td> : null}
                  {after ? <td className="py-1">{conditionRows(after.conditions, units, view.kind)[i]?.value}</td> : null}
                </tr>
              ))}
            </tbody>
          </table>
          {comparison ? <div className="mt-3"><ConditionsVerdict comparison={comparison.conditions} /></div> : null}
        </section>
      ) : null}

      {comparison?.kind === 'dyno' && comparison.runs ? (
        <section className="print-avoid-break">
          <h2 className="mb-2">Change per speed step</h2>
          <table className="w-full text-sm">
            <thead>
              <tr className="text-left text-xs uppercase tracking-wide text-ink-muted">
                <th className="py-1">Speed</th>
                <th className="py-1 text-right">Power before → after</th>
                <th className="py-1 text-right">Torque before → after</th>
              </tr>
            </thead>
            <tbody>
              {comparison.runs.bins.map((b) => (
                <tr key={b.index} className="border-t border-paper-line">
                  <td className="figure py-0.5">{b.from}–{b.to} {b.unit === 'kmh' ? 'km/h' : 'mph'}</td>
                  <td className="figure py-0.5 text-right">{b.power ? `${b.power.deltaPct === null ? '—' : `${b.power.deltaPct > 0 ? '+' : ''}${b.power.deltaPct.toFixed(1)} %`}` : '—'}</td>
                  <td className="figure py-0.5 text-right">{b.torque ? `${b.torque.deltaPct === null ? '—' : `${b.torque.deltaPct > 0 ? '+' : ''}${b.torque.deltaPct.toFixed(1)} %`}` : '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      ) : null}

      <footer className="border-t border-paper-line pt-3 text-xs text-ink-muted">
        <p>
          How the figures are made: power and torque are the figures at the wheel. Wheel angular speed comes from roller speed and the rolling circumference, π × (bead seat
          diameter + 2 × tyre width) from the ISO 5775 size unless a roll-out was measured; power and torque are checked against each other by P = T·ω within {POWER_TORQUE_TOLERANCE * 100} %.
          {legalClass ? ` Legal class: ${legalClass.name}, assistance to ${legalClass.limit} ${legalClass.unit === 'mph' ? 'mph' : 'km/h'} (${legalClass.citation}); a run over the limit prompts a closer look and is no denial on its own.` : ''}
          {' '}Battery capacity by the trapezoidal rule; rated energy = nominal voltage × rated capacity.
        </p>
        <p className="mt-1">Dyno runs and battery discharges carry risk: follow the equipment maker’s instructions, local regulations and your workshop’s safety rules.</p>
      </footer>
    </article>
  );
}
