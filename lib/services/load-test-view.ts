import 'server-only';
import { canAttach } from '@/lib/claims/attachment-rules';
import type { ClaimRecord } from '@/lib/db/claims';
import { listLoadTestRuns, sentAfterTestIds, type LoadTestRun } from '@/lib/db/load-tests';
import type { AppUser } from '@/lib/db/users';
import {
  beforeAfter,
  chartRun,
  conditionsToForm,
  EMPTY_CONDITIONS_FORM,
  legalClassId,
  legalLimitForChart,
  loadTestKindFor,
  runConditionNotes,
  runVerdict,
  type BeforeAfter,
  type ChartRun,
  type ConditionsForm,
  type LoadTestKind,
  type RunVerdict,
} from '@/lib/loadtest-evidence';
import { displayUnit, fromSi, type UnitSystem } from '@/lib/units';
import type { ClaimEventType } from '@/machines/claim';

export type RunView = LoadTestRun & {
  verdict: RunVerdict;
  notes: string[];
  /** An after-test already sent with a step. */
  sent: boolean;
};

export type LoadTestView = {
  units: UnitSystem;
  kind: LoadTestKind;
  /** Brand staff see the legal-class check; it is a prompt for the rep, not something to argue at the counter. */
  showLegalCheck: boolean;
  runs: RunView[];
  before: RunView | null;
  after: RunView | null;
  comparison: BeforeAfter | null;
  chart: { before: ChartRun | null; after: ChartRun | null; legalLimit: number | null; minPower: number | null } | null;
  upload: {
    before: { conditions: ConditionsForm } | null;
    after: { conditions: ConditionsForm } | null;
  };
  /** The after-test the dealer may send next (the newest not yet sent), with the step that sends it. */
  sendable: { run: RunView; step: 'MARK_FITTED' | 'SUBMIT_AFTER_TEST' } | null;
  mayAcceptByHand: boolean;
};

/** Everything the claim page's load-test panel shows, in the reader's units. */
export async function loadTestView(user: AppUser, claim: ClaimRecord, allowed: readonly ClaimEventType[]): Promise<LoadTestView> {
  const units = user.units;
  const kind = loadTestKindFor(claim.partCategory);
  const [rows, sent] = await Promise.all([listLoadTestRuns(claim.id), sentAfterTestIds(claim.id)]);
  const runs: RunView[] = rows.map((r) => ({
    ...r,
    verdict: runVerdict(r.summary, r.spec, units),
    notes: runConditionNotes(r.conditions, units, { kind: r.kind, modelTyreSize: claim.tyreSize }),
    sent: sent.has(r.id),
  }));
  const before = runs.filter((r) => r.phase === 'before').at(-1) ?? null;
  const after = runs.filter((r) => r.phase === 'after').at(-1) ?? null;
  const comparison = before && after && before.kind === after.kind ? beforeAfter(before, after, units) : null;

  let chart: LoadTestView['chart'] = null;
  if (kind === 'dyno' && (before?.summary.kind === 'dyno' || after?.summary.kind === 'dyno')) {
    const spec = (after ?? before)?.spec;
    const minPowerW = spec?.kind === 'dyno' ? spec.minWheelPowerW : null;
    chart = {
      before: before?.summary.kind === 'dyno' ? chartRun(before.summary[units], units) : null,
      after: after?.summary.kind === 'dyno' ? chartRun(after.summary[units], units) : null,
      legalLimit: user.orgKind === 'brand' ? legalLimitForChart(legalClassId(claim.legalClass), units) : null,
      minPower: minPowerW === null || minPowerW === undefined ? null : fromSi('power', minPowerW, displayUnit('power', units)),
    };
  }

  const isDealer = user.orgKind === 'dealer';
  const freshForm = (): ConditionsForm => ({ ...EMPTY_CONDITIONS_FORM, tyreSize: kind === 'dyno' ? (claim.tyreSize ?? '') : '' });
  // The after-test is run like the before-test: its form starts from the before-test's conditions.
  const afterForm = (): ConditionsForm => (before ? { ...conditionsToForm(before.conditions, units), notes: '' } : freshForm());
  const afterOpen = claim.stage === 'approved' && (claim.replacementStep === 'shipped' || claim.replacementStep === 'from_shop_stock' || claim.replacementStep === 'fitted');
  const upload = {
    before: isDealer && canAttach('load_test_before', 'dealer', claim.stage) ? { conditions: freshForm() } : null,
    after: isDealer && afterOpen ? { conditions: afterForm() } : null,
  };

  let sendable: LoadTestView['sendable'] = null;
  const nextAfter = runs.filter((r) => r.phase === 'after' && !r.sent).at(-1);
  if (isDealer && nextAfter) {
    if (allowed.includes('MARK_FITTED')) sendable = { run: nextAfter, step: 'MARK_FITTED' };
    else if (allowed.includes('SUBMIT_AFTER_TEST')) sendable = { run: nextAfter, step: 'SUBMIT_AFTER_TEST' };
  }
  return {
    units, kind, showLegalCheck: user.orgKind === 'brand', runs, before, after, comparison, chart, upload, sendable,
    mayAcceptByHand: allowed.includes('ACCEPT_BY_HAND'),
  };
}
