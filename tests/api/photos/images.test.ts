import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import {
  detectImageType,
  maxInputPixels,
  processUpload,
  UnsupportedImageError,
  type UnsupportedImageReason,
} from '../../../api/lib/images';
import {
  cameraMake,
  exifHasGps,
  makeImage,
  makePhoneJpeg,
  pngClaiming,
  svgDrawing,
  textPretendingToBePng,
} from './test-images';

async function rejectionOf(input: Buffer): Promise<UnsupportedImageError> {
  const error: unknown = await processUpload(input).then(
    () => null,
    (rejected: unknown) => rejected,
  );
  expect(error).toBeInstanceOf(UnsupportedImageError);
  return error as UnsupportedImageError;
}

async function expectRejected(input: Buffer, reason: UnsupportedImageReason) {
  const error = await rejectionOf(input);
  expect(error).toMatchObject({ status: 415, code: 'unsupported_image', reason });
}

describe('detectImageType', () => {
  it('recognises JPEG, PNG and WebP by their first bytes', async () => {
    expect(detectImageType(await makeImage({ format: 'jpeg' }))).toBe('image/jpeg');
    expect(detectImageType(await makeImage({ format: 'png' }))).toBe('image/png');
    expect(detectImageType(await makeImage({ format: 'webp' }))).toBe('image/webp');
  });

  it('refuses SVG, text, GIF, HEIC and empty files', async () => {
    const gif = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#fff' } })
      .gif()
      .toBuffer();
    const heicLike = Buffer.concat([Buffer.from([0, 0, 0, 0x18]), Buffer.from('ftypheic\0\0\0\0mif1heic')]);

    for (const input of [svgDrawing, textPretendingToBePng, gif, heicLike, Buffer.alloc(0)]) {
      expect(detectImageType(input)).toBeNull();
    }
  });

  it('is not fooled by a RIFF file that is not WebP', () => {
    expect(detectImageType(Buffer.from('RIFF\x24\0\0\0WAVEfmt ', 'latin1'))).toBeNull();
  });
});

describe('processUpload', () => {
  it('accepts a PNG and re-encodes it as WebP', async () => {
    const png = await makeImage({ width: 800, height: 600, format: 'png' });

    const { main, thumbnail } = await processUpload(png);

    expect(main).toMatchObject({ contentType: 'image/webp', width: 800, height: 600 });
    expect(await sharp(main.buffer).metadata()).toMatchObject({ format: 'webp', width: 800, height: 600 });
    expect(thumbnail).toMatchObject({ contentType: 'image/webp', width: 480, height: 360 });
    expect(await sharp(thumbnail.buffer).metadata()).toMatchObject({ format: 'webp', width: 480 });
  });

  it('accepts a JPEG and re-encodes it as WebP', async () => {
    const jpeg = await makeImage({ width: 1024, height: 768, format: 'jpeg' });

    const { main, thumbnail } = await processUpload(jpeg);

    expect(detectImageType(main.buffer)).toBe('image/webp');
    expect(main).toMatchObject({ width: 1024, height: 768 });
    expect(thumbnail).toMatchObject({ width: 480, height: 360 });
  });

  it('accepts a WebP', async () => {
    const { main } = await processUpload(await makeImage({ width: 300, height: 200, format: 'webp' }));
    expect(main).toMatchObject({ contentType: 'image/webp', width: 300, height: 200 });
  });

  it('strips EXIF, GPS position included, from a phone JPEG', async () => {
    const phoneJpeg = await makePhoneJpeg();
    const before = await sharp(phoneJpeg).metadata();
    expect(before.exif).toBeDefined();
    expect(exifHasGps(before.exif!)).toBe(true);

    const { main, thumbnail } = await processUpload(phoneJpeg);

    for (const output of [main, thumbnail]) {
      const after = await sharp(output.buffer).metadata();
      expect(after.exif).toBeUndefined();
      expect(after.xmp).toBeUndefined();
      expect(after.iptc).toBeUndefined();
      expect(after.icc).toBeUndefined();
      expect(output.buffer.includes(cameraMake)).toBe(false);
      expect(output.buffer.includes('EXIF')).toBe(false);
    }
  });

  it('turns a photo upright by its EXIF orientation before dropping the tag', async () => {
    // Orientation 6: the camera was held upright, the sensor wrote the pixels sideways.
    const sideways = await makePhoneJpeg({ width: 400, height: 300, orientation: 6 });

    const { main, thumbnail } = await processUpload(sideways);

    expect(main).toMatchObject({ width: 300, height: 400 });
    expect(thumbnail).toMatchObject({ width: 300, height: 400 });
    expect((await sharp(main.buffer).metadata()).orientation).toBeUndefined();
  });

  it('scales a 6000 × 4000 photo to 2560 on its long side, with a 480 thumbnail', async () => {
    const large = await makeImage({ width: 6000, height: 4000, format: 'jpeg' });

    const { main, thumbnail } = await processUpload(large);

    expect(main).toMatchObject({ width: 2560, height: 1707 });
    expect(thumbnail).toMatchObject({ width: 480, height: 320 });
    expect(await sharp(main.buffer).metadata()).toMatchObject({ width: 2560, height: 1707 });
  });

  it('scales a portrait photo by its height', async () => {
    const portrait = await makeImage({ width: 3000, height: 4500, format: 'png' });

    const { main, thumbnail } = await processUpload(portrait);

    expect(main).toMatchObject({ width: 1707, height: 2560 });
    expect(thumbnail).toMatchObject({ width: 320, height: 480 });
  });

  it('never enlarges a small photo', async () => {
    const { main, thumbnail } = await processUpload(await makeImage({ width: 320, height: 240 }));

    expect(main).toMatchObject({ width: 320, height: 240 });
    expect(thumbnail).toMatchObject({ width: 320, height: 240 });
  });

  it('refuses a text file, whatever it is called', async () => {
    await expectRejected(textPretendingToBePng, 'unknown_type');
  });

  it('refuses an SVG', async () => {
    await expectRejected(svgDrawing, 'unknown_type');
  });

  it('refuses a JPEG cut off halfway', async () => {
    const jpeg = await makeImage({ width: 800, height: 600 });
    await expectRejected(jpeg.subarray(0, Math.floor(jpeg.length / 2)), 'unreadable');
  });

  it('refuses PNG magic bytes followed by rubbish', async () => {
    const fake = Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      Buffer.alloc(64, 7),
    ]);
    await expectRejected(fake, 'unreadable');
  });

  it('refuses a tiny file that claims an enormous picture without decoding it', async () => {
    const bomb = pngClaiming(20_000, 20_000);
    expect(bomb.length).toBeLessThan(64 * 1024);
    expect(20_000 * 20_000).toBeGreaterThan(maxInputPixels);

    await expectRejected(bomb, 'too_many_pixels');
  });
});
