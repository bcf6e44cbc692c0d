import { StepButton } from '@/components/claims/step-button';

/** What stands between the draft and the brand, and the submit button once nothing does. */
export function DraftChecklist({ claimId, version, missing }: { claimId: string; version: number; missing: string[] }) {
  return (
    <section className={`card p-5 ${missing.length ? 'border-volt-300' : 'border-charge-300'}`} data-testid="draft-checklist">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <h2>{missing.length ? 'Before you can submit' : 'Ready to submit'}</h2>
          {missing.length ? (
            <ul className="mt-2 list-disc space-y-0.5 pl-5 text-sm" data-testid="missing-list">
              {missing.map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          ) : (
            <p className="mt-1 text-sm text-ink-muted">Everything the brand needs is attached. Submitting sends the claim to the brand’s reps.</p>
          )}
        </div>
        <StepButton claimId={claimId} type="SUBMIT" version={version} label="Submit to the brand" disabled={missing.length > 0} />
      </div>
    </section>
  );
}
