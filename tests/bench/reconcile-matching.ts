/**
 * Times matchStatement on generated statements of 5,000 … 50,000 lines against as many memos.
 * Prints the median of several runs and the growth from one size to the next; it never fails on
 * time. Run: npx tsx tests/bench/reconcile-matching.ts
 */
import { performance } from 'node:perf_hooks';
import { addDays } from '@/lib/calendar';
import { formatClaimNumber, formatCreditMemoNumber, formatRmaNumber } from '@/lib/credits';
import { matchStatement, type MemoForMatching, type StatementLine } from '@/lib/reconciliation';

const SIZES = [5_000, 10_000, 20_000, 50_000];
const RUNS = 7;

/** Deterministic pseudo-random numbers (mulberry32), so every run times the same data. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function generate(n: number): { lines: StatementLine[]; memos: MemoForMatching[] } {
  const rnd = random(n);
  const dealers = 250;
  const memos: MemoForMatching[] = [];
  const lines: StatementLine[] = [];
  for (let i = 0; i < n; i++) {
    const seq = i + 1;
    const dealerId = `D-${Math.floor(rnd() * dealers)}`;
    const issuedOn = addDays('2025-01-01', Math.floor(rnd() * 365));
    // Many equal amounts on purpose: flat-rate labor credits repeat.
    const totalMinor = rnd() < 0.3 ? 4500 * (1 + Math.floor(rnd() * 4)) : Math.floor(rnd() * 200_000) - 20_000;
    const memo: MemoForMatching = {
      id: `m${seq}`,
      number: formatCreditMemoNumber({ year: 2025, sequence: seq }),
      claimNumber: formatClaimNumber({ year: 2025, sequence: seq }),
      rmaNumber: formatRmaNumber({ year: 2025, sequence: seq }),
      dealerId,
      currency: 'USD',
      totalMinor,
      issuedOn,
    };
    memos.push(memo);
    const kind = rnd();
    const date = addDays(issuedOn, Math.floor(rnd() * 9) - 2);
    const reference =
      kind < 0.45
        ? `Credit ${memo.number.toLowerCase().replace(/-/g, ' ')}`
        : kind < 0.6
          ? `claim ${memo.claimNumber} / rma ${memo.rmaNumber}`
          : kind < 0.9
            ? 'warranty credit'
            : undefined;
    const amountMinor = kind < 0.95 ? totalMinor : totalMinor + 1;
    lines.push({ lineNo: seq + 1, amountMinor, date, currency: 'USD', dealerId, ...(reference ? { reference } : {}) });
  }
  return { lines, memos };
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] as number;
};

console.log(`matchStatement: n statement lines against n memos, ${RUNS} runs each, median (Node ${process.version})`);
console.log('      n   median ms   min ms   max ms   matched  ambiguous  unmatched   time ratio / size ratio');
let previous: { n: number; ms: number } | undefined;
for (const n of SIZES) {
  const { lines, memos } = generate(n);
  matchStatement(lines, memos, { dateWindowDays: 7 }); // warm-up
  const times: number[] = [];
  let last: ReturnType<typeof matchStatement> | undefined;
  for (let r = 0; r < RUNS; r++) {
    const t0 = performance.now();
    last = matchStatement(lines, memos, { dateWindowDays: 7 });
    times.push(performance.now() - t0);
  }
  const ms = median(times);
  const growth = previous ? `${(ms / previous.ms).toFixed(2)} / ${(n / previous.n).toFixed(2)}` : '—';
  console.log(
    [
      String(n).padStart(7),
      ms.toFixed(1).padStart(11),
      Math.min(...times).toFixed(1).padStart(8),
      Math.max(...times).toFixed(1).padStart(8),
      String(last?.matches.length).padStart(9),
      String(last?.ambiguous.length).padStart(10),
      String(last?.unmatchedLines.length).padStart(10),
      growth.padStart(25),
    ].join(' '),
  );
  previous = { n, ms };
}
console.log('A time ratio close to the size ratio means linear growth; quadratic would be its square.');
