'use client';

import clsx from 'clsx';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useDropzone } from 'react-dropzone';
import { putWithProgress, sha256Hex } from '@/components/evidence/evidence-dropzone';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ATTACHMENT_LABELS, declaredFileProblem, ruleFor } from '@/lib/claims/attachment-rules';
import { QUANTITY_UNITS, type ColumnQuantity } from '@/lib/loadtest/columns';
import { CONDITION_LABELS, FORM_UNITS, type ConditionsForm, type ConditionsFormField } from '@/lib/loadtest-evidence/form-labels';
import { unitLabel, type Quantity, type UnitSystem } from '@/lib/units';

type Phase = 'before' | 'after';
type Kind = 'dyno' | 'battery';
type Issue = { message: string; row?: number; column?: string };
type Guess = { header: string; columnNumber: number; guess: { quantity: string; unit: string | null } | null; confidence: 'certain' | 'likely' | 'unsure' | null };
type MappingQuestion = {
  intentId: string;
  fileName: string;
  headers: string[];
  guesses: Guess[];
  choice: Record<string, string>;
  savedMappingProblem: string | null;
  remember: boolean;
};
type Status =
  | { state: 'idle' }
  | { state: 'working'; fileName: string; step: string; progress: number }
  | { state: 'done'; fileName: string; message: string; meets: boolean; warnings: Issue[] }
  | { state: 'refused'; fileName: string; message: string; issues: Issue[]; retryIntent: string | null };

const DYNO_QUANTITIES: ColumnQuantity[] = ['time', 'speed', 'wheelTorque', 'wheelPower'];
const BATTERY_QUANTITIES: ColumnQuantity[] = ['time', 'voltage', 'current'];
const UNIT_QUANTITY: Record<ColumnQuantity, Quantity> = { time: 'time', speed: 'speed', wheelPower: 'power', wheelTorque: 'torque', voltage: 'voltage', current: 'current' };
const QUANTITY_WORDS: Record<ColumnQuantity, string> = { time: 'Time', speed: 'Roller speed', wheelTorque: 'Wheel torque', wheelPower: 'Wheel power', voltage: 'Battery voltage', current: 'Discharge current' };

function mappingOptions(kind: Kind) {
  const quantities = kind === 'dyno' ? DYNO_QUANTITIES : BATTERY_QUANTITIES;
  return [
    { value: 'ignore', label: 'Leave this column out' },
    ...quantities.flatMap((q) => QUANTITY_UNITS[q].map((u) => ({ value: `${q}:${u}`, label: `${QUANTITY_WORDS[q]} in ${unitLabel(UNIT_QUANTITY[q], u as never)}` }))),
  ];
}

const fieldsFor = (kind: Kind): ConditionsFormField[] =>
  kind === 'dyno'
    ? ['batterySocStartPct', 'tyreSize', 'tyrePressure', 'tyreMaxPressure', 'measuredCircumference', 'dynoId', 'rollerId', 'load', 'ambientTemp']
    : ['batterySocStartPct', 'ambientTemp'];

/**
 * A load test with its conditions: the dealer fills in how the run was done (in their units),
 * drops the CSV, and the server reads and analyses it. Files with other column names come back
 * with a question per column; a refusal names the line or column and nothing is added.
 */
export function LoadTestUpload({
  claimId, phase, kind, units, initial,
}: {
  claimId: string;
  phase: Phase;
  kind: Kind;
  units: UnitSystem;
  initial: ConditionsForm;
}) {
  const router = useRouter();
  const attachmentKind = phase === 'before' ? 'load_test_before' : 'load_test_after';
  const [form, setForm] = useState<ConditionsForm>(initial);
  const [fieldErrors, setFieldErrors] = useState<Partial<Record<ConditionsFormField, string[]>>>({});
  const [status, setStatus] = useState<Status>({ state: 'idle' });
  const [question, setQuestion] = useState<MappingQuestion | null>(null);
  const u = FORM_UNITS[units];
  const id = (f: string) => `${phase}-${f}`;

  async function record(intentId: string, fileName: string, mapping?: Record<string, unknown>, remember = true) {
    setStatus({ state: 'working', fileName, step: 'reading and analysing…', progress: 1 });
    setFieldErrors({});
    const res = await fetch(`/api/claims/${claimId}/load-tests`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ intentId, units, conditions: form, ...(mapping ? { mapping, saveMapping: remember } : {}) }),
    });
    const data = await res.json().catch(() => ({}));
    if (res.status === 200 && data.status === 'needs-mapping') {
      const choice: Record<string, string> = {};
      for (const h of data.headers as string[]) {
        const p = data.proposedMapping?.[h];
        choice[h] = p && p.quantity !== 'ignore' ? `${p.quantity}:${p.unit}` : 'ignore';
      }
      setQuestion({ intentId, fileName, headers: data.headers, guesses: data.guesses, choice, savedMappingProblem: data.savedMappingProblem ?? null, remember: true });
      setStatus({ state: 'idle' });
      return;
    }
    if (res.ok) {
      setQuestion(null);
      setStatus({ state: 'done', fileName, message: data.verdict, meets: data.meetsSpec, warnings: data.warnings ?? [] });
      router.refresh();
      return;
    }
    const keep = res.status === 422 && (data.retryable === true || Object.keys(data.fieldErrors ?? {}).length > 0);
    if (data.fieldErrors) setFieldErrors(data.fieldErrors);
    if (!keep) setQuestion(null);
    setStatus({ state: 'refused', fileName, message: data.error ?? 'The file could not be added.', issues: data.issues ?? [], retryIntent: keep ? intentId : null });
  }

  async function upload(file: File) {
    setQuestion(null);
    const early = declaredFileProblem(attachmentKind, file.name, file.size);
    if (early) return setStatus({ state: 'refused', fileName: file.name, message: early, issues: [], retryIntent: null });
    try {
      setStatus({ state: 'working', fileName: file.name, step: 'preparing…', progress: 0 });
      const sha256 = await sha256Hex(file);
      const ticketRes = await fetch(`/api/claims/${claimId}/uploads`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ kind: attachmentKind, fileName: file.name, size: file.size, sha256, contentType: file.type || 'text/csv' }),
      });
      const ticket = await ticketRes.json();
      if (!ticketRes.ok) return setStatus({ state: 'refused', fileName: file.name, message: ticket.error, issues: [], retryIntent: null });
      await putWithProgress(ticket.url, file, ticket.headers, (p) => setStatus({ state: 'working', fileName: file.name, step: 'uploading', progress: p }));
      await record(ticket.intentId, file.name);
    } catch (err) {
      setStatus({ state: 'refused', fileName: file.name, message: `${file.name} could not be uploaded: ${(err as Error).message}. Try again.`, issues: [], retryIntent: null });
    }
  }

  const { getRootProps, getInputProps, isDragActive } = useDropzone({ multiple: false, onDrop: (files) => files[0] && void upload(files[0]) });
  const busy = status.state === 'working';

  const fieldUnit: Partial<Record<ConditionsFormField, string>> = {
    batterySocStartPct: '%', tyrePressure: u.pressure, tyreMaxPressure: u.pressure, measuredCircumference: u.circumference, load: u.load, ambientTemp: u.temperature,
  };
  const hints: Partial<Record<ConditionsFormField, string>> = {
    batterySocStartPct: 'Charge it fully right before the run.',
    tyreSize: 'ISO size on the sidewall, e.g. 57-622.',
    tyrePressure: 'Inflate to the sidewall maximum.',
    measuredCircumference: 'Optional: one wheel turn rolled out on the floor. Used instead of the tyre size.',
    dynoId: 'Use the same dyno for before and after.',
    load: kind === 'dyno' ? 'Rider or ballast on the bike.' : undefined,
  };

  return (
    <div className="space-y-4" data-testid={`load-test-upload-${phase}`}>
      {kind === 'dyno' ? (
        <Notice tone="warning" title="Before the dyno run">
          <ul className="list-disc space-y-0.5 pl-5">
            <li>Secure the bike on the dyno; keep hands, hair and loose clothing clear of the roller and the wheel.</li>
            <li>Wear eye protection and keep the area behind the bike clear.</li>
            <li>Charge the battery fully right before each run and inflate the tyre to its sidewall maximum, so before and after compare (common practice).</li>
            <li>Your workshop’s rules and the dyno maker’s instructions come first.</li>
          </ul>
        </Notice>
      ) : (
        <Notice tone="warning" title="Before the discharge">
          <ul className="list-disc space-y-0.5 pl-5">
            <li>Do not discharge a battery that is swollen, dented, wet or hot. Test on a non-flammable surface, away from anything that burns, and never leave it alone while it runs.</li>
            <li>Charge it fully right before the test (common practice). Local regulations and the tester maker’s instructions come first.</li>
          </ul>
        </Notice>
      )}

      <fieldset className="rounded-md border border-paper-line p-4">
        <legend className="px-1 text-sm font-bold">How the {kind === 'dyno' ? 'run' : 'discharge'} was done ({units === 'metric' ? 'metric' : 'imperial'} units)</legend>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {fieldsFor(kind).map((f) => (
            <TextField
              key={f}
              name={id(f)}
              label={fieldUnit[f] ? `${CONDITION_LABELS[f]} (${fieldUnit[f]})` : CONDITION_LABELS[f]}
              value={form[f]}
              inputMode={['dynoId', 'rollerId', 'tyreSize'].includes(f) ? 'text' : 'decimal'}
              onChange={(e) => setForm((old) => ({ ...old, [f]: e.target.value }))}
              errors={fieldErrors[f]}
              hint={hints[f]}
            />
          ))}
          <TextField
            className="sm:col-span-2 lg:col-span-3"
            name={id('notes')}
            label="Notes on the run"
            value={form.notes}
            onChange={(e) => setForm((old) => ({ ...old, notes: e.target.value }))}
            errors={fieldErrors.notes}
          />
        </div>
      </fieldset>

      <div
        {...getRootProps()}
        data-testid={`dropzone-${attachmentKind}`}
        className={clsx(
          'flex cursor-pointer flex-col items-center justify-center rounded-md border-2 border-dashed px-4 py-5 text-center text-sm transition-colors',
          isDragActive ? 'border-charge-500 bg-charge-50' : 'border-paper-line bg-paper hover:border-charge-300',
          busy && 'pointer-events-none opacity-60',
        )}
      >
        <input {...getInputProps()} aria-label={ATTACHMENT_LABELS[attachmentKind]} />
        <p className="font-bold">{ATTACHMENT_LABELS[attachmentKind]}: {kind === 'dyno' ? 'dyno run' : 'capacity discharge'}</p>
        <p className="text-ink-muted">Drop the CSV here or click to choose ({ruleFor(attachmentKind).describe}). Fill in the conditions first; they are recorded with the run.</p>
      </div>

      <div aria-live="polite" data-testid="load-test-status" data-state={status.state}>
        {status.state === 'working' ? (
          <div className="text-sm">
            <p>
              {status.fileName}: {status.step === 'uploading' ? `uploading ${Math.round(status.progress * 100)} %` : status.step}
            </p>
            <div className="mt-1 h-1 overflow-hidden rounded bg-paper-sunk">
              <div className="h-full bg-charge-500 transition-all" style={{ width: `${Math.round(status.progress * 100)}%` }} />
            </div>
          </div>
        ) : null}
        {status.state === 'done' ? (
          <Notice tone={status.meets ? 'success' : 'warning'} title={`${status.fileName} analysed`}>
            <p>{status.message}</p>
            {status.warnings.length ? <p className="mt-1">{status.warnings.length} note{status.warnings.length === 1 ? '' : 's'} on how the file was read; see the run below.</p> : null}
          </Notice>
        ) : null}
        {status.state === 'refused' ? (
          <Notice tone="danger" title={status.message}>
            {status.issues.length ? (
              <ul className="list-disc space-y-0.5 pl-5" data-testid="load-test-issues">
                {status.issues.map((i, k) => (
                  <li key={k}>{i.message}</li>
                ))}
              </ul>
            ) : null}
            {status.retryIntent ? (
              <div className="mt-2">
                <Button type="button" variant="secondary" onClick={() => void record(status.retryIntent!, status.fileName, question ? toMapping(question) : undefined, question?.remember)}>
                  Try again with the corrected {question ? 'columns' : 'conditions'}
                </Button>
              </div>
            ) : null}
          </Notice>
        ) : null}
      </div>

      {question ? (
        <MappingQuestionForm
          kind={kind}
          question={question}
          onChange={setQuestion}
          busy={busy}
          onSubmit={() => void record(question.intentId, question.fileName, toMapping(question), question.remember)}
        />
      ) : null}
    </div>
  );
}

function toMapping(q: MappingQuestion): Record<string, unknown> {
  return Object.fromEntries(
    q.headers.map((h) => {
      const v = q.choice[h] ?? 'ignore';
      if (v === 'ignore') return [h, { quantity: 'ignore' }];
      const [quantity, unit] = v.split(':');
      return [h, { quantity, unit }];
    }),
  );
}

const CONFIDENCE: Record<string, string> = { certain: 'our column name', likely: 'read from the header', unsure: 'a guess; check it' };

function MappingQuestionForm({
  kind, question, onChange, onSubmit, busy,
}: {
  kind: Kind;
  question: MappingQuestion;
  onChange: (q: MappingQuestion) => void;
  onSubmit: () => void;
  busy: boolean;
}) {
  const options = mappingOptions(kind);
  return (
    <section className="rounded-md border border-volt-300 bg-volt-50 p-4" data-testid="mapping-question">
      <h3 className="font-bold">Which column holds what?</h3>
      <p className="mt-1 text-sm">
        {question.fileName} uses column names we do not know. Say what each column holds and in which unit; columns you leave out are not read.
        {kind === 'dyno' ? ' A dyno run needs time, speed and wheel torque or wheel power.' : ' A discharge needs time, voltage and current.'}
      </p>
      {question.savedMappingProblem ? <p className="mt-1 text-sm text-fault-700">{question.savedMappingProblem}</p> : null}
      <table className="mt-3 w-full text-sm">
        <thead>
          <tr className="text-left text-xs uppercase tracking-wide text-ink-muted">
            <th className="py-1 pr-3">Column in the file</th>
            <th className="py-1">Holds</th>
          </tr>
        </thead>
        <tbody>
          {question.headers.map((h, i) => {
            const guess = question.guesses.find((g) => g.header === h);
            return (
              <tr key={`${h}-${i}`} className="border-t border-volt-100">
                <td className="py-2 pr-3 align-top">
                  <span className="font-mono">{h}</span>
                  {guess?.confidence ? <span className="block text-xs text-ink-muted">{CONFIDENCE[guess.confidence]}</span> : null}
                </td>
                <td className="py-2">
                  <select
                    className="field-input"
                    aria-label={`What column “${h}” holds`}
                    value={question.choice[h] ?? 'ignore'}
                    onChange={(e) => onChange({ ...question, choice: { ...question.choice, [h]: e.target.value } })}
                  >
                    {options.map((o) => (
                      <option key={o.value} value={o.value}>
                        {o.label}
                      </option>
                    ))}
                  </select>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <label className="mt-3 flex items-center gap-2 text-sm">
        <input type="checkbox" checked={question.remember} onChange={(e) => onChange({ ...question, remember: e.target.checked })} />
        Remember this for our files with the same columns
      </label>
      <div className="mt-3">
        <Button type="button" onClick={onSubmit} disabled={busy}>
          Read the file with these columns
        </Button>
      </div>
    </section>
  );
}
