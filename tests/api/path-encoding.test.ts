import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/app';

let app: TestApp;
beforeAll(async () => {
  app = await createTestApp();
});
afterAll(() => app.close());

describe('a path segment that is not valid percent-encoding', () => {
  it.each(['%', '%zz', '%FF%FE', '%ED%A0%80'])(
    'answers 400 with a JSON code for %s, never a 500',
    async (segment) => {
      const res = await request(app.app).get(`/api/tanks/${segment}/limits`);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('bad_request');
    },
  );
});
