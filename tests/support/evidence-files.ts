import sharp from 'sharp';

/**
 * Real image files for tests, made on the fly: a picture with the text a photo of a serial
 * label would show, carrying EXIF data with a GPS position that the app must strip.
 */
export async function labelPhoto(text: string, opts: { format?: 'jpeg' | 'png' | 'webp'; withGps?: boolean } = {}): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="960" height="640">
    <rect width="960" height="640" fill="#3b3f42"/>
    <rect x="140" y="200" width="680" height="240" rx="16" fill="#f2f0ea"/>
    <text x="180" y="290" font-family="monospace" font-size="44" fill="#111">${text}</text>
    <text x="180" y="360" font-family="monospace" font-size="28" fill="#444">36V  MADE FOR TESTS</text>
  </svg>`;
  let img = sharp(Buffer.from(svg));
  if (opts.withGps !== false) {
    img = img.withExif({
      IFD0: { Make: 'TestCam', Model: 'Bench 1', Copyright: 'Owner Name' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '47/1 59/1 0/1', GPSLongitudeRef: 'E', GPSLongitude: '7/1 51/1 0/1' },
    });
  }
  const f = opts.format ?? 'jpeg';
  return f === 'png' ? img.png().toBuffer() : f === 'webp' ? img.webp().toBuffer() : img.jpeg({ quality: 85 }).toBuffer();
}

/** A short dyno run in our column layout: power rises, peaks near 22 km/h, tails off at the cut-off. */
export function dynoCsv(opts: { peakW?: number; samples?: number } = {}): string {
  const peak = opts.peakW ?? 520;
  const n = opts.samples ?? 400;
  const lines = ['time_s,speed_kmh,wheel_torque_nm,wheel_power_w'];
  const circumference = Math.PI * (622 + 2 * 50) / 1000;
  for (let i = 0; i < n; i++) {
    const t = i * 0.05;
    const v = 2 + (23 * i) / n;
    const p = Math.max(5, peak * Math.exp(-(((v - 20) / 9) ** 2)));
    const omega = v / 3.6 / (circumference / (2 * Math.PI));
    lines.push(`${t.toFixed(2)},${v.toFixed(3)},${(p / omega).toFixed(3)},${p.toFixed(2)}`);
  }
  return lines.join('\n') + '\n';
}
