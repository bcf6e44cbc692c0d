'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { postJson } from '@/components/review/post-json';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

const newKey = () => (typeof crypto !== 'undefined' && 'randomUUID' in crypto ? crypto.randomUUID() : undefined);

/** Writes one message; a key made per message keeps a double submit to one. */
export function MessageForm({ claimId, placeholder }: { claimId: string; placeholder: string }) {
  const router = useRouter();
  const [text, setText] = useState('');
  const [key, setKey] = useState<string | undefined>(newKey);
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <form
      className="space-y-2"
      data-testid="message-form"
      onSubmit={async (e) => {
        e.preventDefault();
        setPending(true);
        setError(null);
        const r = await postJson(`/api/claims/${claimId}/messages`, { message: text, ...(key ? { clientKey: key } : {}) });
        setPending(false);
        if (!r.ok) {
          setError(r.fieldErrors.message?.[0] ?? r.message);
          return;
        }
        setText('');
        setKey(newKey());
        router.refresh();
      }}
    >
      <label className="sr-only" htmlFor="thread-message">
        Message
      </label>
      <textarea id="thread-message" rows={2} className="field-input" value={text} onChange={(e) => setText(e.target.value)} placeholder={placeholder} />
      {error ? <Notice tone="danger">{error}</Notice> : null}
      <Button type="submit" variant="secondary" disabled={pending || !text.trim()}>
        {pending ? 'Sending…' : 'Send message'}
      </Button>
    </form>
  );
}
