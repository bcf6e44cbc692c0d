'use client';

import { useState } from 'react';
import { savePartAction } from '@/app/(app)/catalog/actions';
import { ButtonLink } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useKeptForm } from '@/components/ui/use-kept-form';
import {
  CATEGORY_NAMES, DYNO_CATEGORIES, MASS_INPUT_UNITS, POWER_INPUT_UNITS, TORQUE_INPUT_UNITS, batteryEnergy, defaultInputUnits, inputUnitLabel, specInputValue,
} from '@/lib/catalog';
import { PART_CATEGORIES, type PartCategory } from '@/lib/coverage';
import type { Part } from '@/lib/db/catalog';
import { toDecimalString, type CurrencyCode } from '@/lib/money';
import type { UnitSystem } from '@/lib/units';
import { Checkbox, FormNotice, NumberWithUnit, SaveButton } from './form-bits';

const unitOptions = (q: 'power' | 'torque' | 'mass', units: readonly string[]) => units.map((u) => ({ value: u, label: inputUnitLabel(q, u) }));

/** A part with the spec its load test is judged against; spec fields follow the kind of part. */
export function PartForm({ part, units, currency }: { part?: Part; units: UnitSystem; currency: string }) {
  const { state, pending, ref, onSubmit } = useKeptForm(savePartAction, { resetOnSuccess: !part });
  const [category, setCategory] = useState<PartCategory>(part?.category ?? 'drive_unit');
  const [volts, setVolts] = useState(part?.nominalVoltageV?.toString() ?? '');
  const [ah, setAh] = useState(part?.ratedCapacityAh?.toString() ?? '');
  const u = defaultInputUnits(units);
  const e = state?.fieldErrors;
  const energy = (() => {
    try {
      return batteryEnergy(Number(volts) || null, Number(ah) || null);
    } catch {
      return null;
    }
  })();

  return (
    <form ref={ref} onSubmit={onSubmit} className="space-y-4" noValidate>
      <FormNotice state={state} />
      {part ? <input type="hidden" name="id" value={part.id} /> : null}
      <TextField label="Part number" name="partNumber" defaultValue={part?.partNumber} errors={e?.partNumber} inputClassName="font-mono" />
      <TextField label="Name" name="name" defaultValue={part?.name} errors={e?.name} />
      <SelectField
        label="Kind of part"
        name="category"
        value={category}
        onChange={(ev) => setCategory(ev.target.value as PartCategory)}
        options={PART_CATEGORIES.map((c) => ({ value: c, label: CATEGORY_NAMES[c] }))}
        errors={e?.category}
      />

      {DYNO_CATEGORIES.includes(category) ? (
        <fieldset className="space-y-3 rounded-md border border-paper-line p-3">
          <legend className="px-1 text-sm font-bold">Dyno spec, measured at the wheel</legend>
          <NumberWithUnit
            label="Minimum wheel power"
            name="minWheelPower"
            unitName="powerUnit"
            units={unitOptions('power', POWER_INPUT_UNITS)}
            defaultUnit={u.power}
            defaultValue={specInputValue('power', part?.minWheelPowerW ?? null, u.power)}
            errors={e?.minWheelPower}
          />
          <NumberWithUnit
            label="Minimum wheel torque"
            name="minWheelTorque"
            unitName="torqueUnit"
            units={unitOptions('torque', TORQUE_INPUT_UNITS)}
            defaultUnit={u.torque}
            defaultValue={specInputValue('torque', part?.minWheelTorqueNm ?? null, u.torque)}
            errors={e?.minWheelTorque}
          />
          <p className="text-xs text-ink-muted">
            A run after the repair passes when its peak reaches these values. A roller reads well below a motor’s rated axle
            torque, so set what a healthy unit shows on your dyno (common practice, no source).
          </p>
        </fieldset>
      ) : null}

      {category === 'battery' ? (
        <fieldset className="space-y-3 rounded-md border border-paper-line p-3">
          <legend className="px-1 text-sm font-bold">Battery rating</legend>
          <div className="grid grid-cols-2 gap-3">
            <NumberWithUnit label="Nominal voltage" name="nominalVoltageV" units={[{ value: 'v', label: 'V' }]} defaultValue={volts} onValue={setVolts} errors={e?.nominalVoltageV} step="0.1" />
            <NumberWithUnit label="Rated capacity" name="ratedCapacityAh" units={[{ value: 'ah', label: 'Ah' }]} defaultValue={ah} onValue={setAh} errors={e?.ratedCapacityAh} step="0.01" />
          </div>
          <p className="text-sm" data-testid="battery-energy">
            Rated energy:{' '}
            {energy ? (
              <>
                <b className="figure">{energy.text}</b> (V × Ah){' '}
                {energy.fullyRegulated ? <span className="text-volt-700">— over 100 Wh: ships as fully regulated Class 9 dangerous goods.</span> : <span className="text-ink-muted">— 100 Wh or less: small-battery provisions may apply.</span>}
              </>
            ) : (
              <span className="text-ink-muted">enter voltage and capacity</span>
            )}
          </p>
          <Notice tone="warning">
            A lithium battery shipped alone travels as UN3480; a damaged or defective one needs special packaging and may not
            go by air. Carrier rules, local regulations and trained staff decide how it is packed.
          </Notice>
        </fieldset>
      ) : null}

      <NumberWithUnit label="Weight" name="weight" unitName="massUnit" units={unitOptions('mass', MASS_INPUT_UNITS)} defaultUnit={u.mass} defaultValue={specInputValue('mass', part?.weightKg ?? null, u.mass)} errors={e?.weight} hint="Shipping weight of the part alone." />
      <TextField label={`Unit cost (${currency})`} name="unitCost" defaultValue={part?.unitCostMinor != null ? toDecimalString(part.unitCostMinor, currency as CurrencyCode) : ''} errors={e?.unitCost} hint="What a replacement costs the brand; a dot for decimals." inputClassName="figure" />
      <Checkbox name="active" label="Offered when filing claims" defaultChecked={part ? part.active : true} />
      <div className="flex gap-2">
        <SaveButton pending={pending}>{part ? 'Save part' : 'Add part'}</SaveButton>
        {part ? <ButtonLink href="/catalog/parts" variant="quiet">Done</ButtonLink> : null}
      </div>
    </form>
  );
}
