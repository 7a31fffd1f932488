import express, { type RequestHandler } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { processUpload } from '../../../api/lib/images';
import { newPhotoKey, type ObjectStorage } from '../../../api/lib/object-storage';
import { errorHandler } from '../../../api/middleware/error-handler';
import { maxPhotoBytes, photoUpload } from '../../../api/middleware/photo-upload';
import { makeImage, svgDrawing, textPretendingToBePng } from './test-images';
import { startTestStorage, type TestStorage } from './test-storage';

/** How a route will use the pieces: parse the upload, re-encode it, store both sizes. */
function storePhoto(storage: ObjectStorage): RequestHandler {
  return async (req, res) => {
    const { main, thumbnail } = await processUpload(req.file!.buffer);
    const mainKey = newPhotoKey('main');
    const thumbnailKey = newPhotoKey('thumbnail');
    await Promise.all([
      storage.put(mainKey, main.buffer, main.contentType),
      storage.put(thumbnailKey, thumbnail.buffer, thumbnail.contentType),
    ]);
    res.status(201).json({ mainKey, thumbnailKey, width: main.width, height: main.height });
  };
}

function uploadApp(storage: ObjectStorage) {
  const app = express();
  app.post('/received', photoUpload, (req, res) => {
    res.json({ field: req.file!.fieldname, bytes: req.file!.size, caption: req.body.caption ?? null });
  });
  app.post('/photos', photoUpload, storePhoto(storage));
  app.use(errorHandler);
  return app;
}

describe('photoUpload', () => {
  let s3: TestStorage;
  let app: express.Express;
  beforeAll(async () => {
    s3 = await startTestStorage();
    app = uploadApp(s3.storage);
  });
  afterAll(() => s3.close());

  it('hands the route the file from the "photo" field and any text fields', async () => {
    const jpeg = await makeImage();

    const res = await request(app)
      .post('/received')
      .field('caption', 'Lounge reef after the water change')
      .attach('photo', jpeg, 'lounge.jpg');

    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      field: 'photo',
      bytes: jpeg.length,
      caption: 'Lounge reef after the water change',
    });
  });

  it('accepts a file of exactly 10 MB', async () => {
    const res = await request(app)
      .post('/received')
      .attach('photo', Buffer.alloc(maxPhotoBytes, 0xab), 'exactly.jpg');

    expect(res.status).toBe(200);
    expect(res.body.bytes).toBe(maxPhotoBytes);
  });

  it('answers a file over 10 MB with a 413', async () => {
    const res = await request(app)
      .post('/received')
      .attach('photo', Buffer.alloc(maxPhotoBytes + 1, 0xab), 'huge.jpg');

    expect(res.status).toBe(413);
    expect(res.body).toEqual({
      error: { code: 'payload_too_large', message: 'The photo is larger than 10 MB.' },
    });
  });

  it('answers a form without a file with a 400', async () => {
    const res = await request(app).post('/received').field('caption', 'forgot the photo');

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('photo_missing');
  });

  it('answers a JSON body with a 400, as it carries no file', async () => {
    const res = await request(app).post('/received').send({ photo: 'data:image/png;base64,AAAA' });

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('photo_missing');
  });

  it('answers a file in another field with a 400', async () => {
    const res = await request(app)
      .post('/received')
      .attach('picture', await makeImage(), 'tank.jpg');

    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({
      code: 'invalid_upload',
      message: expect.stringContaining('"photo"'),
    });
  });

  it('answers two files with a 400', async () => {
    const jpeg = await makeImage();

    const res = await request(app)
      .post('/received')
      .attach('photo', jpeg, 'one.jpg')
      .attach('photo', jpeg, 'two.jpg');

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_upload');
  });

  it('answers a multipart body cut off mid-way with a 400', async () => {
    const res = await request(app)
      .post('/received')
      .set('Content-Type', 'multipart/form-data; boundary=reef')
      .send('--reef\r\nContent-Disposition: form-data; name="photo"; filename="a.jpg"\r\n\r\nabc');

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_upload');
  });

  describe('with processing and storage behind it', () => {
    it('stores the re-encoded photo and its thumbnail', async () => {
      const res = await request(app)
        .post('/photos')
        .attach('photo', await makeImage({ width: 3200, height: 2400, format: 'png' }), 'sump.png');

      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ width: 2560, height: 1920 });
      const main = await s3.storage.get(res.body.mainKey);
      const thumbnail = await s3.storage.get(res.body.thumbnailKey);
      expect(main?.contentType).toBe('image/webp');
      expect(thumbnail?.contentType).toBe('image/webp');
      main?.body.destroy();
      thumbnail?.body.destroy();
    });

    it('answers a text file named .png with a 415', async () => {
      const res = await request(app)
        .post('/photos')
        .attach('photo', textPretendingToBePng, { filename: 'readings.png', contentType: 'image/png' });

      expect(res.status).toBe(415);
      expect(res.body.error.code).toBe('unsupported_image');
    });

    it('answers an SVG with a 415', async () => {
      const res = await request(app)
        .post('/photos')
        .attach('photo', svgDrawing, { filename: 'logo.svg', contentType: 'image/svg+xml' });

      expect(res.status).toBe(415);
      expect(res.body.error.code).toBe('unsupported_image');
    });
  });
});
