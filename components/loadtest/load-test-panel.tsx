import { StepButton } from '@/components/claims/step-button';
import { AcceptByHandForm } from '@/components/loadtest/accept-by-hand-form';
import { LoadTestUpload } from '@/components/loadtest/load-test-upload';
import { PowerTorqueChart } from '@/components/loadtest/power-torque-chart';
import { BatteryFigures, ConditionsList, ConditionsVerdict, DynoFigures, VerdictBadge } from '@/components/loadtest/run-figures';
import { ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import type { ClaimRecord } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';
import { formatDateTime } from '@/lib/format/dates';
import { signedPct } from '@/lib/format/percent';
import { chartAxes, RUN_DOWN_DECELERATION_MS2 } from '@/lib/loadtest-evidence';
import { loadTestView, type LoadTestView, type RunView } from '@/lib/services/load-test-view';
import { formatLength, formatSpeed, type UnitSystem } from '@/lib/units';
import type { ClaimEventType } from '@/machines/claim';

/**
 * The claim's load tests: the dealer adds the before-test while filing and the after-test once the
 * replacement is fitted; everyone on the claim sees the figures, the overlay chart, the verdict and
 * whether the two runs compare. The rep also sees the legal-class check.
 */
export async function LoadTestPanel({ user, claim, allowed }: { user: AppUser; claim: ClaimRecord; allowed: readonly ClaimEventType[] }) {
  const view = await loadTestView(user, claim, allowed);
  const { units, runs, before, after, comparison, chart, upload, sendable } = view;
  const isDealer = user.orgKind === 'dealer';
  const axes = chartAxes(units);
  const legal = view.showLegalCheck ? runs.flatMap((r) => (r.summary.kind === 'dyno' && r.summary[units].legal ? [{ run: r, legal: r.summary[units].legal! }] : [])) : [];
  const tampering = legal.filter((l) => l.legal.possibleTampering);
  const mismatched = runs.filter((r) => r.summary.kind === 'dyno' && r.summary[units].consistency?.flagged);
  const noun = view.kind === 'dyno' ? 'dyno run' : 'capacity discharge';

  return (
    <section className="card space-y-6 p-5" data-testid="load-test-panel">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2>Load tests</h2>
          <p className="text-sm text-ink-muted">
            {view.kind === 'dyno' ? 'Roller-dynamometer runs, checked against the part’s minimum wheel power and torque.' : 'Capacity discharges, checked against the brand’s capacity threshold.'}
          </p>
        </div>
        {runs.length ? (
          <ButtonLink href={`/claims/${claim.id}/load-test-report`} variant="secondary" target="_blank">
            Printable report
          </ButtonLink>
        ) : null}
      </div>

      {tampering.map(({ run, legal: l }) => (
        <Notice key={run.id} tone="warning" title="Possible limiter tampering — check before deciding">
          <p>
            {phaseName(run)}: {l.message}
          </p>
        </Notice>
      ))}
      {mismatched.map((r) => (
        <Notice key={r.id} tone="warning" title={`${phaseName(r)}: power and torque do not agree`}>
          {r.summary.kind === 'dyno' ? r.summary[units].consistency?.message : null}
        </Notice>
      ))}

      {!runs.length && !upload.before && !upload.after ? <p className="text-sm text-ink-muted">No load test yet.</p> : null}

      {chart && (chart.before || chart.after) ? (
        <PowerTorqueChart
          axes={axes}
          before={chart.before}
          after={chart.after}
          legalLimit={chart.legalLimit}
          legalLabel={legal[0] ? `${legal[0].legal.legalClass.name} limit` : undefined}
          minPower={chart.minPower}
        />
      ) : null}
      {chart ? <CurveNote runs={[before, after]} units={units} /> : null}

      {before || after ? <Figures view={view} /> : null}

      {comparison ? (
        <div className="space-y-3" data-testid="before-after">
          <h3 className="font-bold">Before and after</h3>
          <ConditionsVerdict comparison={comparison.conditions} />
          {comparison.kind === 'dyno' && comparison.runs ? (
            <details className="text-sm">
              <summary className="cursor-pointer font-bold">Change per speed step ({comparison.runs.bins.length} steps in both runs)</summary>
              <table className="mt-2 w-full" data-testid="bin-deltas">
                <thead>
                  <tr className="text-left text-xs uppercase tracking-wide text-ink-muted">
                    <th className="py-1">Speed</th>
                    <th className="py-1 text-right">Power change</th>
                    <th className="py-1 text-right">Torque change</th>
                  </tr>
                </thead>
                <tbody>
                  {comparison.runs.bins.map((b) => (
                    <tr key={b.index} className="border-t border-paper-line">
                      <td className="figure py-1">
                        {b.from}–{b.to} {b.unit === 'kmh' ? 'km/h' : 'mph'}
                      </td>
                      <td className="figure py-1 text-right">{signedPct(b.power?.deltaPct ?? null)}</td>
                      <td className="figure py-1 text-right">{signedPct(b.torque?.deltaPct ?? null)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </details>
          ) : null}
          {comparison.runs === null ? <p className="text-sm text-ink-muted">{runs.at(-1)?.verdict.message}</p> : null}
        </div>
      ) : null}

      {runs.length ? (
        <div className="space-y-4">
          {[...runs].reverse().map((r) => (
            <RunCard key={r.id} run={r} view={view} timeZone={user.timeZone} latest={r.id === before?.id || r.id === after?.id} />
          ))}
        </div>
      ) : null}

      {sendable ? (
        <div className="rounded-md border border-charge-300 bg-charge-50 p-4" data-testid="send-after-test">
          <p className="font-bold">{sendable.step === 'MARK_FITTED' ? 'Replacement fitted? Send it with this after-test.' : 'Send this new after-test to the brand.'}</p>
          <p className="mt-1 text-sm">
            {sendable.run.fileName}: {sendable.run.verdict.message}{' '}
            {sendable.run.verdict.meets ? 'The repair is verified as soon as you send it.' : 'It does not meet the spec, so the rep decides; you can also run the test again and upload a new file.'}
          </p>
          <div className="mt-3">
            <StepButton
              claimId={claim.id}
              type={sendable.step}
              version={claim.version}
              payload={{ afterTestId: sendable.run.id }}
              label={sendable.step === 'MARK_FITTED' ? 'Mark fitted with this after-test' : 'Send this after-test'}
            />
          </div>
        </div>
      ) : null}

      {view.mayAcceptByHand ? (
        <div className="rounded-md border border-volt-300 bg-volt-50 p-4">
          <p className="font-bold">The after-test does not meet the part’s spec.</p>
          <p className="mt-1 mb-3 text-sm">Wait for a new after-test from the dealer, or accept this one by hand if the repair is sound.</p>
          <AcceptByHandForm claimId={claim.id} version={claim.version} />
        </div>
      ) : null}

      {upload.after ? (
        <div className="space-y-2 border-t border-paper-line pt-5">
          <h3 className="font-bold">After the repair: run the same test again</h3>
          <p className="text-sm text-ink-muted">
            With the replacement fitted, repeat the {noun} under the same conditions as before (they are filled in from the before-test). The app checks it against the part’s spec; a passing after-test verifies the repair.
          </p>
          <LoadTestUpload claimId={claim.id} phase="after" kind={view.kind} units={units} initial={upload.after.conditions} />
        </div>
      ) : null}

      {upload.before ? (
        <div className="space-y-2 border-t border-paper-line pt-5">
          <h3 className="font-bold">{before ? 'Add another before-test' : 'The load test before the repair'}</h3>
          <LoadTestUpload claimId={claim.id} phase="before" kind={view.kind} units={units} initial={upload.before.conditions} />
        </div>
      ) : null}

      {isDealer && !upload.before && !upload.after && !runs.length ? <p className="text-sm text-ink-muted">Load tests cannot be added at this stage.</p> : null}
    </section>
  );
}

/** Which samples the curve leaves out, so a reader can square the curve with the peaks. */
export function CurveNote({ runs, units, className = '-mt-4' }: { runs: (RunView | null)[]; units: UnitSystem; className?: string }) {
  const cut = runs.flatMap((r) => (r && r.summary.kind === 'dyno' && r.summary.curve?.samplesLeftOut ? [`${r.phase}: ${r.summary.curve.samplesLeftOut.toLocaleString('en')} samples`] : []));
  if (!cut.length) return null;
  return <p className={`${className} text-xs text-ink-muted`}>The curves leave out the run-down, where the roller slows by more than {formatSpeed(RUN_DOWN_DECELERATION_MS2, units).text} a second ({cut.join('; ')}); peaks and checks use the whole run.</p>;
}

const phaseName = (r: RunView) => (r.phase === 'before' ? 'Before-test' : 'After-test');

function Figures({ view }: { view: LoadTestView }) {
  const { before, after, units } = view;
  if ((before ?? after)?.summary.kind === 'battery') {
    return (
      <BatteryFigures
        before={before?.summary.kind === 'battery' ? before.summary.analysis : null}
        after={after?.summary.kind === 'battery' ? after.summary.analysis : null}
      />
    );
  }
  return <DynoFigures before={before?.summary.kind === 'dyno' ? before.summary[units] : null} after={after?.summary.kind === 'dyno' ? after.summary[units] : null} units={units} />;
}

function RunCard({ run, view, timeZone, latest }: { run: RunView; view: LoadTestView; timeZone: string; latest: boolean }) {
  const { units } = view;
  const s = run.summary;
  const dyno = s.kind === 'dyno' ? s[units] : null;
  return (
    <article className="rounded-md border border-paper-line p-4" data-testid="load-test-run" data-phase={run.phase} data-meets={run.meetsSpec}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h3 className="font-bold">
            {run.phase === 'before' ? 'Before the repair' : 'After the repair'}: {run.kind === 'dyno' ? 'dyno run' : 'capacity discharge'}
            {!latest ? <span className="ml-2 text-xs font-normal text-ink-muted">(earlier run)</span> : null}
          </h3>
          <p className="text-xs text-ink-muted">
            <a className="underline" href={`/api/attachments/${run.attachmentId}`}>{run.fileName}</a> · {run.sampleCount.toLocaleString('en')} samples · {run.createdByName ?? 'dealer'} ·{' '}
            {formatDateTime(run.createdAt, timeZone)}
            {run.mappingSource === 'saved' ? ' · columns read with your saved mapping' : run.mappingSource === 'entered' ? ' · columns as mapped by the dealer' : ''}
            {run.phase === 'after' ? (run.sent ? ' · sent to the brand' : ' · not sent yet') : ''}
          </p>
        </div>
        <VerdictBadge verdict={run.verdict} />
      </div>
      <p className="mt-2 text-sm" data-testid="run-verdict">{run.verdict.message}</p>
      {dyno?.consistency ? (
        <p className={`mt-1 text-sm ${dyno.consistency.flagged ? 'text-fault-700' : 'text-ink-muted'}`}>
          {dyno.consistency.message} (tolerance {(dyno.consistency.tolerance * 100).toFixed(0)} %)
        </p>
      ) : null}
      {view.showLegalCheck && dyno?.legal && !dyno.legal.possibleTampering ? <p className="mt-1 text-sm text-ink-muted">{dyno.legal.message}</p> : null}
      {s.kind === 'battery' && s.analysis.internalResistanceNote ? <p className="mt-1 text-sm text-ink-muted">{s.analysis.internalResistanceNote}</p> : null}
      {s.kind === 'dyno' ? (
        <p className="mt-1 text-xs text-ink-muted">
          Wheel circumference {s.circumference.source === 'measured' ? 'measured' : `from the tyre size ${s.circumference.tyreIso ?? ''} (π × (bead seat + 2 × width))`}
          {dyno ? `: ${formatLength(dyno.circumferenceM, units).text}` : ''}.
        </p>
      ) : null}

      <details className="mt-3">
        <summary className="cursor-pointer text-sm font-bold">Test conditions{run.notes.length ? ` (${run.notes.length} to note)` : ''}</summary>
        <div className="mt-2 space-y-2">
          <ConditionsList conditions={run.conditions} units={units} kind={run.kind} />
          {run.notes.length ? (
            <ul className="list-disc space-y-0.5 pl-5 text-sm text-volt-700">
              {run.notes.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          ) : null}
        </div>
      </details>
      {(
        <details className="mt-2">
          <summary className="cursor-pointer text-sm font-bold">How the file was read{run.warnings.length ? ` (${run.warnings.length} note${run.warnings.length === 1 ? '' : 's'})` : ''}</summary>
          <ul className="mt-2 list-disc space-y-0.5 pl-5 text-sm">
            <li>
              Columns: {Object.entries(run.columnMapping).map(([h, r]) => `${h} → ${r.quantity}${'unit' in r ? ` (${r.unit})` : ''}`).join('; ')}
            </li>
            {run.warnings.map((w, i) => (
              <li key={i}>{w.message}</li>
            ))}
          </ul>
        </details>
      )}
    </article>
  );
}
