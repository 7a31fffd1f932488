import { crc32, deflateSync } from 'node:zlib';
import sharp from 'sharp';

type Format = 'jpeg' | 'png' | 'webp';

export interface ImageSpec {
  width?: number;
  height?: number;
  format?: Format;
  /** Reef-tank blue unless a test cares. */
  background?: string;
}

/** A real image, drawn in memory: a flat background with a lighter band so it is not one colour. */
export async function makeImage({
  width = 640,
  height = 480,
  format = 'jpeg',
  background = '#1f5f8b',
}: ImageSpec = {}): Promise<Buffer> {
  const band = await sharp({
    create: { width, height: Math.max(1, Math.round(height / 4)), channels: 3, background: '#f2c14e' },
  })
    .png()
    .toBuffer();
  return sharp({ create: { width, height, channels: 3, background } })
    .composite([{ input: band, top: Math.round(height / 3), left: 0 }])
    .toFormat(format)
    .toBuffer();
}

export const cameraMake = 'Brinewatch Test Camera';

/** A JPEG as a phone writes it: camera EXIF, GPS position of the tank, and a rotation flag. */
export async function makePhoneJpeg({
  width = 400,
  height = 300,
  orientation = 1,
}: { width?: number; height?: number; orientation?: number } = {}): Promise<Buffer> {
  return sharp(await makeImage({ width, height, format: 'png' }))
    .jpeg()
    .withExif({
      IFD0: { Make: cameraMake, Model: 'Lagoon 7', Copyright: 'Driftglass Aquatics' },
      // libvips calls the GPS directory IFD3.
      IFD3: {
        GPSLatitudeRef: 'N',
        GPSLatitude: '51/1 30/1 2640/100',
        GPSLongitudeRef: 'W',
        GPSLongitude: '0/1 7/1 3960/100',
      },
    })
    .withMetadata({ orientation })
    .toBuffer();
}

/** True when the EXIF block's main directory points at a GPS directory (tag 0x8825). */
export function exifHasGps(exif: Buffer): boolean {
  const tiff = exif.subarray(exif.toString('latin1', 0, 6) === 'Exif\0\0' ? 6 : 0);
  const littleEndian = tiff.toString('latin1', 0, 2) === 'II';
  const u16 = (at: number) => (littleEndian ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at));
  const u32 = (at: number) => (littleEndian ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at));
  const ifd0 = u32(4);
  const entries = u16(ifd0);
  for (let i = 0; i < entries; i++) {
    if (u16(ifd0 + 2 + i * 12) === 0x8825) return true;
  }
  return false;
}

function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/**
 * A few hundred bytes that claim to be a width × height greyscale PNG: what a decompression
 * bomb looks like to a decoder that trusts the header.
 */
export function pngClaiming(width: number, height: number): Buffer {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header.writeUInt8(8, 8); // bit depth
  header.writeUInt8(0, 9); // greyscale
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', header),
    pngChunk('IDAT', deflateSync(Buffer.alloc(width + 1))),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}

export const svgDrawing = Buffer.from(
  '<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" width="64" height="64">' +
    '<script>alert(1)</script><circle cx="32" cy="32" r="30" fill="#1f5f8b"/></svg>',
);

export const textPretendingToBePng = Buffer.from('Nitrate 10 ppm, phosphate 0.03 ppm. Water change due.\n');
