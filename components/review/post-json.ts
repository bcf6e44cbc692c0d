// Client side: send a step or a message and read the server's answer in one shape.
export type Answer = { ok: true; data: Record<string, unknown> } | { ok: false; status: number; message: string; fieldErrors: Record<string, string[]> };

export async function postJson(url: string, body: Record<string, unknown>): Promise<Answer> {
  let res: Response;
  try {
    res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  } catch {
    return { ok: false, status: 0, message: 'The connection failed; nothing was sent. Try again.', fieldErrors: {} };
  }
  const data = (await res.json().catch(() => ({}))) as Record<string, unknown>;
  if (res.ok) return { ok: true, data };
  return {
    ok: false,
    status: res.status,
    message: typeof data.error === 'string' ? data.error : 'That did not go through.',
    fieldErrors: (data.fieldErrors as Record<string, string[]>) ?? {},
  };
}

export const postStep = (claimId: string, body: Record<string, unknown>) => postJson(`/api/claims/${claimId}/steps`, body);
