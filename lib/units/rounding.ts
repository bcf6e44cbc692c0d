/** Round half away from zero to `decimals` places; never returns -0. */
export function roundTo(value: number, decimals: number): number {
  const scale = 10 ** decimals;
  const r = (Math.sign(value) * Math.round(Math.abs(value) * scale)) / scale;
  return r === 0 ? 0 : r;
}
