'use client';

import { Button } from '@/components/ui/button';
import type { FilingOptions } from '@/lib/services/filing';

export type PartLine = { partId: string; quantity: number; fromDealerStock: boolean };

type Brand = FilingOptions[number];

export function RequestLines({
  brand, parts, labor, freight, onParts, onLabor, onFreight, errors,
}: {
  brand: Brand;
  parts: PartLine[];
  labor: string[];
  freight: string;
  onParts: (p: PartLine[]) => void;
  onLabor: (l: string[]) => void;
  onFreight: (f: string) => void;
  errors: Record<string, string[]>;
}) {
  const update = (i: number, patch: Partial<PartLine>) => onParts(parts.map((p, j) => (j === i ? { ...p, ...patch } : p)));
  return (
    <div className="space-y-5">
      <div>
        <h3 className="field-label">Replacement parts</h3>
        <div className="space-y-2">
          {parts.map((line, i) => (
            <div key={i} className="flex flex-wrap items-center gap-2" data-testid="requested-part">
              <select aria-label="Replacement part" className="field-input max-w-md" value={line.partId} onChange={(e) => update(i, { partId: e.target.value })}>
                {brand.parts.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.partNumber} — {p.name}
                  </option>
                ))}
              </select>
              <input aria-label="Quantity" type="number" min={1} max={10} className="field-input w-20" value={line.quantity} onChange={(e) => update(i, { quantity: Number(e.target.value) })} />
              <label className="flex items-center gap-2 text-sm">
                <input type="checkbox" checked={line.fromDealerStock} onChange={(e) => update(i, { fromDealerStock: e.target.checked })} />
                Fitted from our own stock
              </label>
              <Button type="button" variant="quiet" onClick={() => onParts(parts.filter((_, j) => j !== i))}>
                Remove
              </Button>
              {errors[`parts.${i}.quantity`]?.map((e) => <span key={e} className="field-error">{e}</span>)}
            </div>
          ))}
          <Button type="button" variant="secondary" onClick={() => onParts([...parts, { partId: brand.parts[0]?.id ?? '', quantity: 1, fromDealerStock: false }])}>
            Add a part
          </Button>
          <p className="text-xs text-ink-muted">“Fitted from our own stock”: you used a part from your shelf and want it credited at your net price instead of a shipped replacement.</p>
        </div>
      </div>

      <fieldset>
        <legend className="field-label">Labor, from {brand.brandName}’s schedule</legend>
        <div className="grid gap-1 md:grid-cols-2">
          {brand.labor.map((op) => (
            <label key={op.id} className="flex items-start gap-2 rounded-md px-2 py-1 text-sm hover:bg-paper-sunk">
              <input
                type="checkbox"
                className="mt-1"
                checked={labor.includes(op.id)}
                onChange={(e) => onLabor(e.target.checked ? [...labor, op.id] : labor.filter((l) => l !== op.id))}
              />
              <span>
                <span className="font-mono text-xs">{op.code}</span> {op.description} <span className="figure text-ink-muted">· {op.hours} h</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>

      <div className="max-w-xs">
        <label htmlFor="freight" className="field-label">Freight you paid ({brand.currency})</label>
        <input id="freight" name="freight" inputMode="decimal" className="field-input" value={freight} onChange={(e) => onFreight(e.target.value)} placeholder="0.00" />
        {errors.freight?.map((e) => <p key={e} className="field-error">{e}</p>)}
      </div>
    </div>
  );
}
