'use client';

import { useRouter } from 'next/navigation';
import { useRef, useState } from 'react';
import { parseDocumentNumber } from '@/lib/credits/document-numbers';

/**
 * Finds a claim by its RMA number. A barcode scanner types the number and presses Enter, so the
 * field takes either; the check digit catches a mistyped number before the server is asked.
 */
export function RmaScan() {
  const router = useRouter();
  const input = useRef<HTMLInputElement>(null);
  const [value, setValue] = useState('');
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function find(e: React.FormEvent) {
    e.preventDefault();
    const text = value.trim();
    if (!text) return;
    const parsed = parseDocumentNumber(text);
    if (!parsed.ok) return setMessage(parsed.message.charAt(0).toUpperCase() + parsed.message.slice(1) + '.');
    setBusy(true);
    const res = await fetch(`/api/warehouse/rma/${encodeURIComponent(text)}`);
    const data = await res.json().catch(() => ({}));
    setBusy(false);
    if (!res.ok) {
      setMessage(data.error ?? 'Not found.');
      input.current?.select();
      return;
    }
    setMessage(null);
    router.push(`/warehouse/claims/${data.claimId}#core`);
  }

  return (
    <form onSubmit={find} className="card flex flex-wrap items-end gap-3 p-4" role="search" data-testid="rma-scan">
      <div className="min-w-64 flex-1">
        <label htmlFor="rma" className="field-label">Receive a core: scan or type the RMA number</label>
        <input
          ref={input}
          id="rma"
          className="field-input font-mono text-lg"
          value={value}
          onChange={(e) => {
            setValue(e.target.value);
            setMessage(null);
          }}
          placeholder="RMA-…"
          autoComplete="off"
          autoFocus
          aria-describedby="rma-message"
        />
      </div>
      <button type="submit" className="min-h-10 rounded-md bg-ink px-4 py-2 text-sm font-bold text-paper hover:bg-ink-soft" disabled={busy}>
        {busy ? 'Looking…' : 'Find'}
      </button>
      <p id="rma-message" className="w-full text-sm text-fault-700" role={message ? 'alert' : undefined}>{message}</p>
    </form>
  );
}
