import type { StoredBatteryClass } from '@/lib/fulfilment/dangerous-goods';

/**
 * The lithium-battery rules for a parcel, as the shipper needs them: the UN number and class, the
 * marks, the packing steps for a damaged battery, the cautions, and every rule applied with its
 * reference (marked where the reference was not checked against a published copy).
 */
export function DangerousGoodsPanel({ batteries, title = 'Lithium battery: dangerous goods' }: { batteries: StoredBatteryClass[]; title?: string }) {
  if (!batteries.length) return null;
  return (
    <div className="space-y-3 rounded-md border-2 border-volt-300 bg-volt-50 p-4 text-sm" data-testid="dangerous-goods">
      <p className="font-bold text-volt-700">{title}</p>
      {batteries.map((b) => (
        <div key={b.partNumber} className="space-y-2">
          <p className="font-bold text-ink">
            <span className="font-mono">{b.partNumber}</span>: {b.unNumber} {b.properShippingName} · Class 9 · {b.watthours} Wh ·{' '}
            {b.fullyRegulated ? 'fully regulated' : 'small-battery provisions'}
            {b.specialPackagingRequired ? ' · damaged or defective: ground only' : ''}
          </p>
          <div>
            <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">Marks and labels on the box</p>
            <ul className="ml-4 list-disc text-ink" data-testid="dg-marks">
              {b.marks.map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          </div>
          {b.packagingSteps.length ? (
            <div>
              <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">Special packaging (49 CFR 173.185(f))</p>
              <ol className="ml-4 list-decimal text-ink" data-testid="dg-packaging">
                {b.packagingSteps.map((s) => (
                  <li key={s}>{s}</li>
                ))}
              </ol>
            </div>
          ) : null}
          <div>
            <p className="text-xs font-bold uppercase tracking-wide text-ink-muted">Cautions</p>
            <ul className="ml-4 list-disc text-ink" data-testid="dg-cautions">
              {b.cautions.map((c) => (
                <li key={c}>{c}</li>
              ))}
            </ul>
          </div>
          <details className="text-xs text-ink-soft">
            <summary className="cursor-pointer font-bold">Rules applied ({b.rules.length})</summary>
            <ul className="mt-1 space-y-1">
              {b.rules.map((r, i) => (
                <li key={i}>
                  <span className="font-bold">{r.ref}</span>
                  {r.fromMemory ? <span className="text-ink-muted"> (reference not checked against a published copy)</span> : null}: {r.text}
                </li>
              ))}
            </ul>
          </details>
        </div>
      ))}
    </div>
  );
}
