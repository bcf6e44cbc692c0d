export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export function layout(body: string): string {
  return `<!doctype html><html><body style="font-family:Verdana,sans-serif;color:#1c2124;background:#f6f4ef;padding:24px">
<div style="max-width:560px;margin:auto;background:#fff;border:1px solid #d9d4c8;border-radius:10px;padding:24px">
<p style="font-weight:bold;color:#176646;margin-top:0">Loadproof</p>${body}</div></body></html>`;
}
