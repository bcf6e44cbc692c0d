/**
 * Times what the server does with an uploaded statement before it writes anything: read the CSV
 * (parseStatementCsv, every row checked) and match it (matchStatement) against as many open
 * memos. Prints medians for 5,000 … 50,000 lines and the growth between sizes; it never fails on
 * time. Run: npx tsx tests/bench/statement-import.ts
 */
import { performance } from 'node:perf_hooks';
import { addDays } from '@/lib/calendar';
import { formatClaimNumber, formatCreditMemoNumber, formatRmaNumber } from '@/lib/credits';
import { toDecimalString } from '@/lib/money';
import { matchStatement, parseStatementCsv, type MemoForMatching } from '@/lib/reconciliation';

const SIZES = [5_000, 10_000, 20_000, 50_000];
const RUNS = 5;

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

/** One dealer's statement (semicolons, day-first dates, comma decimals) and the brand's memos. */
function generate(n: number): { csv: string; memos: MemoForMatching[] } {
  const rnd = random(n);
  const memos: MemoForMatching[] = [];
  const rows = ['Datum;Buchungstext;Betrag'];
  for (let i = 0; i < n; i++) {
    const seq = i + 1;
    const issuedOn = addDays('2026-01-01', Math.floor(rnd() * 330));
    const totalMinor = rnd() < 0.3 ? 15800 * (1 + Math.floor(rnd() * 3)) : Math.floor(rnd() * 150_000) - 10_000;
    memos.push({
      id: `m${seq}`, number: formatCreditMemoNumber({ year: 2026, sequence: seq }), claimNumber: formatClaimNumber({ year: 2026, sequence: seq }),
      rmaNumber: formatRmaNumber({ year: 2026, sequence: seq }), dealerId: 'D1', currency: 'EUR', totalMinor, issuedOn,
    });
    const date = addDays(issuedOn, Math.floor(rnd() * 10));
    const [y, m, d] = date.split('-');
    const text = rnd() < 0.7 ? `Gutschrift ${memos[i]!.number}` : 'Garantie';
    rows.push(`${d}.${m}.${y};${text};${toDecimalString(totalMinor, 'EUR').replace('.', ',')}`);
  }
  return { csv: rows.join('\n'), memos };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] as number;

console.log(`statement import, pure part: parse n CSV rows + match against n memos, ${RUNS} runs, median (Node ${process.version})`);
console.log('      n   parse ms   match ms   total ms   proposed   time ratio / size ratio');
let previous: { n: number; ms: number } | undefined;
for (const n of SIZES) {
  const { csv, memos } = generate(n);
  const run = () => {
    const t0 = performance.now();
    const parsed = parseStatementCsv(csv, { mapping: { date: 'Datum', reference: 'Buchungstext', amount: 'Betrag' }, currency: 'EUR', decimalSeparator: ',', dateFormat: 'DD.MM.YYYY', dealerId: 'D1' });
    const t1 = performance.now();
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors.slice(0, 3)));
    const result = matchStatement(parsed.lines, memos, { dateWindowDays: 14, statementDealerId: 'D1' });
    const t2 = performance.now();
    return { parse: t1 - t0, match: t2 - t1, proposed: result.matches.length };
  };
  run();
  const runs = Array.from({ length: RUNS }, run);
  const parse = median(runs.map((r) => r.parse));
  const match = median(runs.map((r) => r.match));
  const total = median(runs.map((r) => r.parse + r.match));
  const growth = previous ? `${(total / previous.ms).toFixed(2)} / ${(n / previous.n).toFixed(2)}` : '—';
  console.log([String(n).padStart(7), parse.toFixed(1).padStart(10), match.toFixed(1).padStart(10), total.toFixed(1).padStart(10), String(runs[0]!.proposed).padStart(10), growth.padStart(25)].join(' '));
  previous = { n, ms: total };
}
console.log('A time ratio close to the size ratio means linear growth; quadratic would be its square.');
