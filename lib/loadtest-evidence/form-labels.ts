// The conditions form's fields, labels and units: no analysis code, so browser components can import it.

/** The test-conditions form as typed, in the user's units. Every field may be left empty. */
export interface ConditionsForm {
  batterySocStartPct: string;
  tyreSize: string;
  measuredCircumference: string;
  tyrePressure: string;
  tyreMaxPressure: string;
  dynoId: string;
  rollerId: string;
  load: string;
  ambientTemp: string;
  notes: string;
}

export type ConditionsFormField = keyof ConditionsForm;

export const EMPTY_CONDITIONS_FORM: ConditionsForm = {
  batterySocStartPct: '', tyreSize: '', measuredCircumference: '', tyrePressure: '', tyreMaxPressure: '', dynoId: '', rollerId: '',
  load: '', ambientTemp: '', notes: '',
};

/** Units the form shows per unit system. A measured roll-out is in mm or inches, like the tape it is measured with. */
export const FORM_UNITS = {
  metric: { pressure: 'bar', load: 'kg', temperature: '°C', circumference: 'mm' },
  imperial: { pressure: 'psi', load: 'lb', temperature: '°F', circumference: 'in' },
} as const;

export const CONDITION_LABELS: Record<ConditionsFormField, string> = {
  batterySocStartPct: 'Battery charge at start',
  tyreSize: 'Tyre size',
  measuredCircumference: 'Measured wheel circumference',
  tyrePressure: 'Tyre pressure',
  tyreMaxPressure: 'Sidewall maximum pressure',
  dynoId: 'Dyno',
  rollerId: 'Roller',
  load: 'Rider or load',
  ambientTemp: 'Room temperature',
  notes: 'Notes',
};

