'use client';

import { useRouter } from 'next/navigation';
import { useMemo, useState } from 'react';
import { FrameLookup, type LookupResult } from '@/components/claims/frame-lookup';
import { RequestLines, type PartLine } from '@/components/claims/request-lines';
import { SafetyNotes } from '@/components/claims/safety-notes';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { PART_CATEGORY_LABELS, type PartCategory } from '@/lib/coverage/policy';
import type { FilingOptions } from '@/lib/services/filing';
import { MILE_M } from '@/lib/units/constants';

export type ClaimFormValues = {
  brandId: string;
  frameSerial: string;
  modelId: string;
  saleDate: string;
  partId: string;
  partSerial: string;
  failureDate: string;
  odometerKm: number | null;
  batteryCycles: string;
  symptom: string;
  errorCodes: string;
  description: string;
  customerName: string;
  customerEmail: string;
  customerPhone: string;
  parts: PartLine[];
  labor: string[];
  freight: string;
};

const KM_PER_MILE = MILE_M / 1000;

export function ClaimForm({
  options, units, initial, claimId, version,
}: {
  options: FilingOptions;
  units: 'metric' | 'imperial';
  initial?: ClaimFormValues;
  claimId?: string;
  version?: number;
}) {
  const router = useRouter();
  const [v, setV] = useState<ClaimFormValues>(
    initial ?? {
      brandId: options.length === 1 ? options[0]!.brandId : '', frameSerial: '', modelId: '', saleDate: '', partId: '', partSerial: '',
      // The shop's own today, not UTC's: an evening in Portland is already tomorrow in UTC.
      failureDate: new Date().toLocaleDateString('en-CA'), odometerKm: null, batteryCycles: '', symptom: '', errorCodes: '',
      description: '', customerName: '', customerEmail: '', customerPhone: '', parts: [], labor: [], freight: '',
    },
  );
  const [odometer, setOdometer] = useState(() =>
    v.odometerKm === null ? '' : String(Math.round((units === 'imperial' ? v.odometerKm / KM_PER_MILE : v.odometerKm) * 10) / 10),
  );
  const [lookup, setLookup] = useState<LookupResult | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  // One key per form: a double click or a retry finds the draft already made.
  const [clientKey] = useState(() => crypto.randomUUID());

  const brand = options.find((o) => o.brandId === v.brandId);
  const part = brand?.parts.find((p) => p.id === v.partId);
  const registered = lookup?.registered ?? false;
  const set = <K extends keyof ClaimFormValues>(k: K, value: ClaimFormValues[K]) => setV((old) => ({ ...old, [k]: value }));

  const partsByCategory = useMemo(() => {
    const groups = new Map<string, { value: string; label: string }[]>();
    for (const p of brand?.parts ?? []) {
      const list = groups.get(p.category) ?? [];
      list.push({ value: p.id, label: `${p.partNumber} — ${p.name}` });
      groups.set(p.category, list);
    }
    return groups;
  }, [brand]);

  function choosePart(id: string) {
    const chosen = brand?.parts.find((p) => p.id === id);
    setV((old) => {
      const serial = chosen && lookup?.unit?.componentSerials[chosen.category];
      const suggestedLabor = brand?.labor.filter((l) => l.category === chosen?.category || l.category === null).map((l) => l.id) ?? [];
      return {
        ...old,
        partId: id,
        partSerial: old.partSerial || serial || '',
        // The failed part is the usual replacement; the dealer can change it below.
        parts: old.parts.length ? old.parts : chosen ? [{ partId: chosen.id, quantity: 1, fromDealerStock: false }] : [],
        labor: old.labor.length ? old.labor : suggestedLabor,
      };
    });
  }

  function onLookup(r: LookupResult | null) {
    setLookup(r);
    if (r?.registered && r.unit) setV((old) => ({ ...old, modelId: r.unit!.modelId, saleDate: r.unit!.retailSaleDate, frameSerial: r.unit!.frameSerial }));
  }

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setPending(true);
    setErrors({});
    setMessage(null);
    const km = odometer.trim() === '' ? null : Number(odometer.replace(',', '.')) * (units === 'imperial' ? KM_PER_MILE : 1);
    const body = {
      ...v,
      odometerKm: km === null || Number.isNaN(km) ? (odometer.trim() ? odometer : null) : Math.round(km * 10) / 10,
      batteryCycles: v.batteryCycles === '' ? null : v.batteryCycles,
      labor: v.labor.map((operationId) => ({ operationId })),
      version,
      clientKey: claimId ? undefined : clientKey,
    };
    const res = await fetch(claimId ? `/api/claims/${claimId}` : '/api/claims', {
      method: claimId ? 'PATCH' : 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });
    const data = await res.json().catch(() => ({}));
    setPending(false);
    if (!res.ok) {
      setErrors(data.fieldErrors ?? {});
      setMessage(data.error ?? 'The claim could not be saved.');
      window.scrollTo({ top: 0, behavior: 'smooth' });
      return;
    }
    router.push(`/claims/${claimId ?? data.id}`);
    router.refresh();
  }

  const err = (k: string) => errors[k];

  return (
    <form onSubmit={save} className="space-y-6" noValidate>
      {message ? <Notice tone="danger" title={message}>{Object.keys(errors).length ? 'See the marked fields below.' : null}</Notice> : null}

      <section className="card space-y-4 p-5">
        <h2>The bike</h2>
        <div className="grid gap-4 md:grid-cols-2">
          <SelectField
            label="Brand the claim goes to"
            name="brandId"
            value={v.brandId}
            disabled={!!claimId}
            onChange={(e) => setV((old) => ({ ...old, brandId: e.target.value, modelId: '', partId: '', parts: [], labor: [] }))}
            options={[{ value: '', label: 'Choose…' }, ...options.map((o) => ({ value: o.brandId, label: `${o.brandName} (account ${o.accountNumber})` }))]}
            errors={err('brandId')}
          />
          <FrameLookup brandId={v.brandId} value={v.frameSerial} onChange={(s) => set('frameSerial', s)} onResult={onLookup} errors={err('frameSerial')} />
        </div>
        <div className="grid gap-4 md:grid-cols-2">
          <SelectField
            label="Model"
            name="modelId"
            value={v.modelId}
            disabled={registered}
            onChange={(e) => set('modelId', e.target.value)}
            options={[{ value: '', label: brand ? 'Choose…' : 'Choose the brand first' }, ...(brand?.models ?? []).map((m) => ({ value: m.id, label: `${m.name} (${m.code})` }))]}
            errors={err('modelId')}
          />
          <TextField
            label="Retail sale date"
            name="saleDate"
            type="date"
            value={v.saleDate}
            disabled={registered}
            onChange={(e) => set('saleDate', e.target.value)}
            hint={registered ? 'From the brand’s registration.' : 'From the customer’s receipt; add the proof of purchase as evidence.'}
            errors={err('saleDate')}
          />
        </div>
      </section>

      <section className="card space-y-4 p-5">
        <h2>The failed part</h2>
        <div className="grid gap-4 md:grid-cols-2">
          <div>
            <label htmlFor="partId" className="field-label">Failed part</label>
            <select id="partId" name="partId" className="field-input" value={v.partId} onChange={(e) => choosePart(e.target.value)} aria-invalid={!!err('partId')}>
              <option value="">{brand ? 'Choose…' : 'Choose the brand first'}</option>
              {[...partsByCategory.entries()].map(([cat, list]) => (
                <optgroup key={cat} label={PART_CATEGORY_LABELS[cat as PartCategory] ?? cat}>
                  {list.map((o) => (
                    <option key={o.value} value={o.value}>{o.label}</option>
                  ))}
                </optgroup>
              ))}
            </select>
            {err('partId')?.map((e) => <p key={e} className="field-error">{e}</p>)}
          </div>
          <TextField label="Part serial" name="partSerial" value={v.partSerial} onChange={(e) => set('partSerial', e.target.value)} hint="From the label on the part." errors={err('partSerial')} />
        </div>
        {part ? <SafetyNotes category={part.category} /> : null}
        <div className="grid gap-4 md:grid-cols-3">
          <TextField label="Failure date" name="failureDate" type="date" value={v.failureDate} onChange={(e) => set('failureDate', e.target.value)} errors={err('failureDate')} />
          <TextField
            label={`Odometer (${units === 'imperial' ? 'mi' : 'km'})`}
            name="odometer"
            inputMode="decimal"
            value={odometer}
            onChange={(e) => setOdometer(e.target.value)}
            errors={err('odometerKm')}
          />
          {part?.category === 'battery' ? (
            <TextField label="Battery charge cycles" name="batteryCycles" inputMode="numeric" value={v.batteryCycles} onChange={(e) => set('batteryCycles', e.target.value)} hint="From the display or the diagnostic tool." errors={err('batteryCycles')} />
          ) : null}
        </div>
        <TextField label="What the rider noticed" name="symptom" value={v.symptom} onChange={(e) => set('symptom', e.target.value)} placeholder="e.g. assist cuts out under load on climbs" errors={err('symptom')} />
        <div className="grid gap-4 md:grid-cols-2">
          <TextField label="Error codes" name="errorCodes" value={v.errorCodes} onChange={(e) => set('errorCodes', e.target.value)} placeholder="e.g. E-042, E-107" errors={err('errorCodes')} />
        </div>
        <div>
          <label htmlFor="description" className="field-label">Your diagnosis</label>
          <textarea id="description" name="description" rows={4} className="field-input" value={v.description} onChange={(e) => set('description', e.target.value)} placeholder="What you tested and what you found." />
        </div>
      </section>

      <section className="card space-y-4 p-5">
        <h2>What you ask the brand for</h2>
        {brand ? (
          <RequestLines
            brand={brand}
            parts={v.parts}
            labor={v.labor}
            freight={v.freight}
            onParts={(p) => set('parts', p)}
            onLabor={(l) => set('labor', l)}
            onFreight={(f) => set('freight', f)}
            errors={errors}
          />
        ) : (
          <p className="text-ink-muted">Choose the brand first.</p>
        )}
      </section>

      <section className="card space-y-4 p-5">
        <h2>The customer</h2>
        <p className="text-sm text-ink-muted">Personal data: shown only to your shop and the brand, and left out of exports.</p>
        <div className="grid gap-4 md:grid-cols-3">
          <TextField label="Name" name="customerName" value={v.customerName} onChange={(e) => set('customerName', e.target.value)} errors={err('customerName')} />
          <TextField label="E-mail" name="customerEmail" type="email" value={v.customerEmail} onChange={(e) => set('customerEmail', e.target.value)} errors={err('customerEmail')} />
          <TextField label="Phone" name="customerPhone" value={v.customerPhone} onChange={(e) => set('customerPhone', e.target.value)} errors={err('customerPhone')} />
        </div>
      </section>

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : claimId ? 'Save changes' : 'Save draft and add evidence'}
        </Button>
        <p className="text-sm text-ink-muted">Nothing goes to the brand until you submit the claim.</p>
      </div>
    </form>
  );
}
