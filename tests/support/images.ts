import zlib from 'node:zlib';
import sharp from 'sharp';

/** A small JPEG carrying a real EXIF block with a GPS IFD (latitude and longitude) and a camera make. */
export async function jpegWithGps(width = 64, height = 48): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: '#6b4f3a' } })
    .jpeg()
    .withExif({
      IFD0: { Make: 'TestCam', Model: 'Garden 1' },
      // IFD3 is the GPS IFD: 51°30'N 0°7'W.
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' },
    })
    .toBuffer();
}

/** A small PNG. */
export async function smallPng(width = 40, height = 30): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 4, background: { r: 90, g: 70, b: 50, alpha: 1 } } }).png().toBuffer();
}

/** A small WebP. */
export async function smallWebp(): Promise<Buffer> {
  return sharp({ create: { width: 30, height: 20, channels: 3, background: '#556b2f' } }).webp().toBuffer();
}

/** Tags of the EXIF GPS IFD (0x8825 in IFD0) in a raw EXIF block, or [] — a minimal TIFF reader. */
export function gpsTags(exif: Buffer | undefined): number[] {
  if (!exif) return [];
  const t = exif.subarray(exif.subarray(0, 4).toString('latin1') === 'Exif' ? 6 : 0);
  const le = t.toString('latin1', 0, 2) === 'II';
  const u16 = (o: number) => (le ? t.readUInt16LE(o) : t.readUInt16BE(o));
  const u32 = (o: number) => (le ? t.readUInt32LE(o) : t.readUInt32BE(o));
  const entries = (off: number) => Array.from({ length: u16(off) }, (_, i) => ({ tag: u16(off + 2 + i * 12), value: u32(off + 2 + i * 12 + 8) }));
  const gps = entries(u32(4)).find((e) => e.tag === 0x8825);
  return gps ? entries(gps.value).map((e) => e.tag) : [];
}

function pngChunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(body) >>> 0);
  return Buffer.concat([len, body, crc]);
}

/**
 * A decompression bomb: a PNG of about a kilobyte whose header declares
 * `side` × `side` pixels (20000 × 20000 = 400 megapixels).
 */
export function pngBomb(side = 20_000): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(side, 0);
  ihdr.writeUInt32BE(side, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // greyscale
  const rows = zlib.deflateSync(Buffer.alloc((side + 1) * 50)); // only the first rows; the rest never arrive
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), pngChunk('IHDR', ihdr), pngChunk('IDAT', rows), pngChunk('IEND', Buffer.alloc(0))]);
}
