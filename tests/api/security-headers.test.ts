import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/app';

// RFC 6797 §7.2: Strict-Transport-Security is sent over secure transport only.
describe('Strict-Transport-Security', () => {
  let plain: TestApp;
  let secure: TestApp;
  beforeAll(async () => {
    plain = await createTestApp({ APP_ORIGIN: 'http://localhost:3000' });
    secure = await createTestApp({ APP_ORIGIN: 'https://brinewatch.example.test' });
  });
  afterAll(async () => {
    await plain.close();
    await secure.close();
  });

  it('is not sent over plain http', async () => {
    const res = await request(plain.app).get('/api/health');
    expect(res.headers['strict-transport-security']).toBeUndefined();
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });

  it('is sent when a proxy on this machine says the request came over https', async () => {
    const res = await request(plain.app).get('/api/health').set('X-Forwarded-Proto', 'https');
    expect(res.headers['strict-transport-security']).toMatch(/^max-age=\d+/);
  });

  it('is sent when the app is served from an https origin', async () => {
    const res = await request(secure.app).get('/api/health');
    expect(res.headers['strict-transport-security']).toMatch(/^max-age=\d+/);
  });
});
