import bwipjs from 'bwip-js/node';

/**
 * A Code 128 barcode as a PNG, drawn by bwip-js (a port of the Barcode Writer in Pure PostScript).
 * Two pixels per module, a white background and a quiet zone of 10 modules either side
 * (ISO/IEC 15417 asks for at least 10), so a scanner or a test can read the bars back exactly.
 */
export async function code128Png(text: string, opts: { heightMm?: number } = {}): Promise<Buffer> {
  return bwipjs.toBuffer({
    bcid: 'code128',
    text,
    scale: 2,
    height: opts.heightMm ?? 12,
    includetext: false,
    backgroundcolor: 'FFFFFF',
    paddingwidth: 10,
    paddingheight: 2,
  });
}
