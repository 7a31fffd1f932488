import sharp from 'sharp';
import { HttpError } from './http-error';

/** The formats a photo may arrive in: what phone cameras and browsers produce and sharp decodes. */
export type AcceptedImageType = 'image/jpeg' | 'image/png' | 'image/webp';

/**
 * Every stored photo is WebP: about a third smaller than JPEG at the same look, keeps the
 * transparency of a PNG screenshot, and every browser the portal supports shows it.
 */
export const photoFormat = { contentType: 'image/webp', extension: 'webp' } as const;

export const maxPhotoSide = 2560;
export const thumbnailSide = 480;

/**
 * 8192 × 8192 (67 MP) admits the 48–50 MP sensors of current phones and refuses images whose
 * header promises far more pixels than their bytes suggest (decompression bombs), which would
 * otherwise take hundreds of megabytes to decode.
 */
export const maxInputPixels = 8192 * 8192;

export interface EncodedImage {
  buffer: Buffer;
  contentType: typeof photoFormat.contentType;
  width: number;
  height: number;
}

export interface ProcessedPhoto {
  main: EncodedImage;
  thumbnail: EncodedImage;
}

export type UnsupportedImageReason = 'unknown_type' | 'unreadable' | 'too_many_pixels';

/** A 415 the error handler renders as it stands, since it is an HttpError. */
export class UnsupportedImageError extends HttpError {
  constructor(
    readonly reason: UnsupportedImageReason,
    message: string,
  ) {
    super(415, 'unsupported_image', message);
    this.name = 'UnsupportedImageError';
  }
}

const pngSignature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/**
 * Decides by the file's first bytes, never by its name or the browser's claimed type. GIF
 * (animation, 256 colours) and HEIC (no decoder in sharp's prebuilt binaries) are refused;
 * an iPhone normally hands a web page's file input a JPEG copy of a HEIC photo.
 */
export function detectImageType(buffer: Buffer): AcceptedImageType | null {
  if (buffer.length >= 3 && buffer[0] === 0xff && buffer[1] === 0xd8 && buffer[2] === 0xff) {
    return 'image/jpeg';
  }
  if (buffer.subarray(0, 8).equals(pngSignature)) return 'image/png';
  if (
    buffer.length >= 12 &&
    buffer.toString('latin1', 0, 4) === 'RIFF' &&
    buffer.toString('latin1', 8, 12) === 'WEBP'
  ) {
    return 'image/webp';
  }
  return null;
}

const sharpFormatOf: Record<AcceptedImageType, string> = {
  'image/jpeg': 'jpeg',
  'image/png': 'png',
  'image/webp': 'webp',
};

const unreadable = () =>
  new UnsupportedImageError('unreadable', 'The photo could not be read. Try saving it again as JPEG.');

/**
 * Re-encodes an uploaded photo so that nothing the camera wrote travels on: the pixels are
 * turned upright by the EXIF orientation, then EXIF (GPS included), XMP, IPTC and ICC data are
 * dropped, since sharp keeps metadata only when asked to.
 */
export async function processUpload(buffer: Buffer): Promise<ProcessedPhoto> {
  const type = detectImageType(buffer);
  if (!type) {
    throw new UnsupportedImageError('unknown_type', 'Upload a photo in JPEG, PNG or WebP format.');
  }

  // Reading the header decodes no pixels, so it runs without sharp's pixel limit; otherwise a
  // bomb would surface as a generic failure rather than as a photo that is too large.
  const header = await sharp(buffer, { limitInputPixels: false })
    .metadata()
    .catch(() => {
      throw unreadable();
    });
  // The magic bytes and the decoder must agree; a JPEG prefix on something else is not a JPEG.
  if (header.format !== sharpFormatOf[type]) throw unreadable();
  if (header.width * header.height > maxInputPixels) {
    throw new UnsupportedImageError(
      'too_many_pixels',
      `The photo has more than ${Math.round(maxInputPixels / 1e6)} megapixels. Send a smaller one.`,
    );
  }

  // The pixel limit stays on for decoding in case a decoder sees more than the header said.
  // 'error' rather than the default 'warning': phones write JPEGs with harmless quirks
  // (extra bytes after the end marker) that should not cost the technician the photo.
  const upright = sharp(buffer, { limitInputPixels: maxInputPixels, failOn: 'error' }).autoOrient();
  const [main, thumbnail] = await Promise.all([
    encode(upright.clone(), maxPhotoSide, 82),
    encode(upright.clone(), thumbnailSide, 75),
  ]).catch((error: unknown) => {
    throw error instanceof UnsupportedImageError ? error : unreadable();
  });
  return { main, thumbnail };
}

async function encode(image: sharp.Sharp, longestSide: number, quality: number): Promise<EncodedImage> {
  const { data, info } = await image
    .resize({ width: longestSide, height: longestSide, fit: 'inside', withoutEnlargement: true })
    .webp({ quality })
    .toBuffer({ resolveWithObject: true });
  return { buffer: data, contentType: photoFormat.contentType, width: info.width, height: info.height };
}
