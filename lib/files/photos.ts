import sharp from 'sharp';

/**
 * Re-encodes a photo without its metadata (GPS position, camera serial, owner name) after
 * turning it upright by its EXIF orientation, and makes a small WebP thumbnail.
 */
export async function cleanPhoto(bytes: Buffer, mime: string): Promise<{ photo: Buffer; thumbnail: Buffer; width: number; height: number }> {
  const upright = sharp(bytes, { failOn: 'error' }).rotate();
  const encoded =
    mime === 'image/png' ? upright.png() : mime === 'image/webp' ? upright.webp({ quality: 88 }) : upright.jpeg({ quality: 88, mozjpeg: true });
  const photo = await encoded.toBuffer();
  const meta = await sharp(photo).metadata();
  const thumbnail = await sharp(photo).resize({ width: 480, height: 480, fit: 'inside', withoutEnlargement: true }).webp({ quality: 75 }).toBuffer();
  return { photo, thumbnail, width: meta.width ?? 0, height: meta.height ?? 0 };
}
