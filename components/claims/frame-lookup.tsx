'use client';

import Link from 'next/link';
import { useEffect, useRef, useState } from 'react';
import { TextField } from '@/components/ui/field';

export type LookupResult = {
  registered: boolean;
  unit: { frameSerial: string; modelId: string; modelName: string; retailSaleDate: string; componentSerials: Record<string, string> } | null;
  openClaims: { id: string | null; number: string | null; stage: string; ours: boolean }[];
};

/** Looks the frame serial up in the brand's registry as the dealer types it. */
export function FrameLookup({
  brandId, value, onChange, onResult, errors,
}: {
  brandId: string;
  value: string;
  onChange: (v: string) => void;
  onResult: (r: LookupResult | null) => void;
  errors?: string[];
}) {
  const [result, setResult] = useState<LookupResult | null>(null);
  const [busy, setBusy] = useState(false);
  const last = useRef('');
  const onResultRef = useRef(onResult);
  onResultRef.current = onResult;

  useEffect(() => {
    const serial = value.trim();
    if (!brandId || serial.length < 3) {
      setResult(null);
      onResultRef.current(null);
      return;
    }
    const key = `${brandId}|${serial.toUpperCase()}`;
    if (key === last.current) return;
    const t = setTimeout(async () => {
      setBusy(true);
      last.current = key;
      const res = await fetch(`/api/registry/lookup?brand=${brandId}&serial=${encodeURIComponent(serial)}`);
      setBusy(false);
      if (!res.ok) return;
      const r = (await res.json()) as LookupResult;
      setResult(r);
      onResultRef.current(r);
    }, 350);
    return () => clearTimeout(t);
  }, [brandId, value]);

  return (
    <div>
      <TextField label="Frame serial" name="frameSerial" value={value} onChange={(e) => onChange(e.target.value)} autoComplete="off" spellCheck={false} inputClassName="font-mono" errors={errors} />
      <div className="mt-2 min-h-5 text-sm" aria-live="polite" data-testid="registry-result">
        {busy ? <span className="text-ink-muted">Looking it up…</span> : null}
        {!busy && result?.registered && result.unit ? (
          <span className="text-charge-700">
            Registered: {result.unit.modelName}, sold {result.unit.retailSaleDate}. No proof of purchase needed.
          </span>
        ) : null}
        {!busy && result && !result.registered ? (
          <span className="text-volt-700">Not in this brand’s registry: choose the model, enter the sale date and add the proof of purchase.</span>
        ) : null}
        {result?.openClaims.length ? (
          <p className="mt-1 text-fault-700" role="alert">
            This frame already has an open claim:{' '}
            {result.openClaims.map((c, i) =>
              c.ours && c.id ? (
                <Link key={c.id} href={`/claims/${c.id}`} className="font-bold underline">
                  {c.number}
                </Link>
              ) : (
                <span key={i}>one filed by another shop ({c.stage.replace(/_/g, ' ')})</span>
              ),
            )}
            . Check it is not the same fault.
          </p>
        ) : null}
      </div>
    </div>
  );
}
