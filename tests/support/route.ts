// Calls a route handler the way Next.js does: a Request and the dynamic params as a promise.
type Handler<P> = (req: Request, ctx: { params: Promise<P> }) => Promise<Response>;

export async function call<P>(handler: Handler<P>, params: P, init: { method?: string; body?: unknown; path?: string } = {}) {
  const req = new Request(`http://127.0.0.1${init.path ?? '/api/test'}`, {
    method: init.method ?? (init.body === undefined ? 'GET' : 'POST'),
    headers: init.body === undefined ? {} : { 'content-type': 'application/json' },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
  });
  const res = await handler(req, { params: Promise.resolve(params) });
  const type = res.headers.get('content-type') ?? '';
  const data = type.includes('json') ? await res.json() : Buffer.from(await res.arrayBuffer());
  return { status: res.status, data, headers: res.headers };
}
