import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/app';

describe('API error handling', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('answers an unknown /api route with a JSON 404', async () => {
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.type).toBe('application/json');
    expect(res.body.error).toMatchObject({ code: 'route_not_found' });
  });

  it('answers malformed JSON with a 400', async () => {
    const res = await request(t.app)
      .post('/api/health')
      .set('Content-Type', 'application/json')
      .send('{"oops":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed_json');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.js/);
  });

  it('answers a body over the limit with a 413', async () => {
    const big = JSON.stringify({ note: 'x'.repeat(1_100_000) });
    const res = await request(t.app).post('/api/health').set('Content-Type', 'application/json').send(big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('answers an unexpected content type with a 415', async () => {
    const res = await request(t.app).post('/api/health').set('Content-Type', 'text/xml').send('<a/>');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
  });

  it('tags every response with a request id', async () => {
    const res = await request(t.app).get('/api/health').set('X-Request-Id', 'trace-12345678');
    expect(res.headers['x-request-id']).toBe('trace-12345678');
  });
});
