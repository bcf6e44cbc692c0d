'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { postStep } from '@/components/review/post-json';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

function useStep(claimId: string) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});
  async function send(body: Record<string, unknown>) {
    setPending(true);
    setError(null);
    const r = await postStep(claimId, body);
    setPending(false);
    if (!r.ok) {
      setError(r.message);
      setFieldErrors(r.fieldErrors);
      if (r.status === 409) router.refresh();
      return;
    }
    setFieldErrors({});
    router.refresh();
  }
  return { send, pending, error, fieldErrors };
}

/** The dealer's answer to a request for more: a message, and the files already added above. */
export function ResubmitForm({ claimId, version, newFiles }: { claimId: string; version: number; newFiles: number }) {
  const [text, setText] = useState('');
  const { send, pending, error, fieldErrors } = useStep(claimId);
  return (
    <form
      className="space-y-3"
      data-testid="resubmit-form"
      onSubmit={(e) => {
        e.preventDefault();
        void send({ type: 'RESUBMIT', version, ...(text.trim() ? { message: text.trim() } : {}) });
      }}
    >
      <div>
        <label className="field-label" htmlFor="resubmit-message">
          Your answer to the rep
        </label>
        <textarea id="resubmit-message" rows={3} className="field-input" value={text} onChange={(e) => setText(e.target.value)} placeholder="What you checked and what you attached." />
        {fieldErrors.message?.map((m) => <p key={m} className="field-error">{m}</p>)}
      </div>
      <p className="text-sm text-ink-muted">
        {newFiles === 0 ? 'Add the requested photos and files in the Evidence section first; they go with your answer.' : `${newFiles} new file${newFiles === 1 ? '' : 's'} will go with your answer.`}
      </p>
      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" disabled={pending}>
        {pending ? 'Sending…' : 'Send the requested items'}
      </Button>
    </form>
  );
}

/** The dealer's one appeal of a denial. */
export function AppealForm({ claimId, version }: { claimId: string; version: number }) {
  const [text, setText] = useState('');
  const { send, pending, error, fieldErrors } = useStep(claimId);
  return (
    <form
      className="space-y-3"
      data-testid="appeal-form"
      onSubmit={(e) => {
        e.preventDefault();
        if (!window.confirm('Appeal this decision? A claim can be appealed once.')) return;
        void send({ type: 'APPEAL', version, message: text });
      }}
    >
      <div>
        <label className="field-label" htmlFor="appeal-message">
          Why the decision should change
        </label>
        <textarea id="appeal-message" rows={3} className="field-input" value={text} onChange={(e) => setText(e.target.value)} />
        {fieldErrors.message?.map((m) => <p key={m} className="field-error" role="alert">{m}</p>)}
      </div>
      <p className="text-sm text-ink-muted">Add new evidence in the Evidence section before you appeal. Another rep of the brand reviews the appeal.</p>
      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" disabled={pending}>
        {pending ? 'Sending…' : 'Appeal the denial'}
      </Button>
    </form>
  );
}
