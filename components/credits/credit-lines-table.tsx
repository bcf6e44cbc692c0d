import { Badge } from '@/components/ui/badge';
import { describeBasis, type CreditLine } from '@/lib/credits';
import { toDecimalString, type CurrencyCode } from '@/lib/money';
import { EditLineForm } from './edit-line-form';
import { LINE_KIND_LABELS, LINE_STATUS_LABELS } from './labels';
import { MoneyFigure } from './money-figure';

const STATUS_TONE = { credited: 'charge', withheld: 'volt', not_credited: 'neutral', charged_back: 'fault' } as const;

/** A memo's lines, each with the sentence that explains its amount; editable on a draft. */
export function CreditLinesTable({
  lines, currency, totalMinor, edit,
}: {
  lines: CreditLine[];
  currency: string;
  totalMinor: number;
  edit?: { claimId: string };
}) {
  const cur = currency as CurrencyCode;
  return (
    <table className="w-full text-left text-sm" data-testid="credit-lines">
      <thead className="text-xs uppercase tracking-wide text-ink-muted">
        <tr>
          <th className="py-2 pr-3">#</th>
          <th className="py-2 pr-3">Line and how it was reached</th>
          <th className="py-2 pr-3">Status</th>
          <th className="py-2 pr-3 text-right">Computed</th>
          <th className="py-2 text-right">Posts</th>
        </tr>
      </thead>
      <tbody>
        {lines.map((l) => {
          const edited = l.adjustments.length > 0;
          return (
            <tr key={l.lineNo} className="border-t border-paper-line align-top" data-testid={`credit-line-${l.lineNo}`}>
              <td className="py-2 pr-3 figure">{l.lineNo}</td>
              <td className="py-2 pr-3">
                <p>
                  <span className="text-xs font-bold uppercase tracking-wide text-ink-muted">{LINE_KIND_LABELS[l.kind]}</span>{' '}
                  {l.partNumber ? <span className="font-mono text-xs">{l.partNumber}</span> : l.laborCode ? <span className="font-mono text-xs">{l.laborCode}</span> : null}{' '}
                  {l.description}
                </p>
                <p className="mt-0.5 text-xs text-ink-muted">{describeBasis(l, cur)}</p>
                {edit && (l.status === 'credited' || l.status === 'charged_back') ? (
                  <details className="mt-1 print:hidden">
                    <summary className="cursor-pointer text-xs font-bold text-charge-700">Adjust this line</summary>
                    <EditLineForm claimId={edit.claimId} lineNo={l.lineNo} current={toDecimalString(l.amountMinor, cur)} chargeback={l.kind === 'chargeback'} />
                  </details>
                ) : null}
              </td>
              <td className="py-2 pr-3">
                <Badge tone={STATUS_TONE[l.status]}>{LINE_STATUS_LABELS[l.status]}</Badge>
                {edited ? <Badge tone="volt" className="ml-1">Adjusted</Badge> : null}
              </td>
              <td className="py-2 pr-3 text-right">
                <MoneyFigure minor={l.computedMinor} currency={currency} className={edited ? 'text-ink-muted line-through' : 'text-ink-muted'} />
              </td>
              <td className="py-2 text-right">
                <MoneyFigure minor={l.amountMinor} currency={currency} strong />
              </td>
            </tr>
          );
        })}
        <tr className="border-t-2 border-ink">
          <td />
          <td className="py-2 pr-3 font-bold" colSpan={3}>
            Total {totalMinor < 0 ? '(the dealer owes this)' : ''}
          </td>
          <td className="py-2 text-right" data-testid="lines-total" data-amount={toDecimalString(totalMinor, cur)}>
            <MoneyFigure minor={totalMinor} currency={currency} strong className="text-base" />
          </td>
        </tr>
      </tbody>
    </table>
  );
}
