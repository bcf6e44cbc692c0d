/** A change in per cent to one decimal, signed; a change that rounds to nothing reads 0.0 %, never −0.0 %. */
export function signedPct(x: number | null): string {
  if (x === null || !Number.isFinite(x)) return '—';
  const shown = x.toFixed(1);
  if (Number(shown) === 0) return '0.0 %';
  return `${x > 0 ? '+' : ''}${shown} %`;
}
