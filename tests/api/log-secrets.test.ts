import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLogger } from '../../api/lib/logger';
import { hashToken } from '../../api/lib/tokens';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { HttpBrowser, location } from '../helpers/http-browser';
import { enrol, openSignInPage, startTestStack, submitSignIn, type TestStack } from '../helpers/stack';
import { deviceFor } from './readings-kit';

/**
 * OWASP ASVS 5.0 V16 (security logging): the log holds no credentials, tokens, session ids or
 * personal data. The whole app runs at debug level into one captured log while a representative
 * flow goes through the real stack; every secret the flow handled is then looked for in it.
 */
describe('the log of a full run', () => {
  const lines: string[] = [];
  const secrets = new Map<string, string>();
  let stack: TestStack;
  let log = '';
  const statuses: Record<string, number> = {};

  const keep = (name: string, value: string | null | undefined) => {
    if (!value) throw new Error(`no ${name} to look for`);
    secrets.set(name, value);
  };

  /** A sign-in through the provider stand-in, keeping what it exposed along the way. */
  async function signInKeeping(browser: HttpBrowser, person: TestPerson, label: string) {
    const { authorizationUrl } = await openSignInPage(stack, browser);
    const { form } = await openSignInPage(stack, browser);
    keep(`${label}: nonce of an unfinished start`, new URL(authorizationUrl).searchParams.get('nonce'));
    keep(`${label}: pre-login cookie`, browser.cookies(stack.origin).get('bw_login'));
    const callback = new URL(await submitSignIn(stack, browser, form.action, person));
    keep(`${label}: OIDC code`, callback.searchParams.get('code'));
    keep(`${label}: OIDC state`, callback.searchParams.get('state'));
    const done = await browser.visit(callback);
    const cookie = browser.cookies(stack.origin).get('bw_session');
    keep(`${label}: session cookie`, cookie);
    const signed = decodeURIComponent(cookie!);
    keep(`${label}: session id`, signed.slice(2, signed.lastIndexOf('.')));
    keep(`${label}: password`, person.password);
    keep(`${label}: e-mail`, person.email);
    return location(done, stack.origin);
  }

  const call = (browser: HttpBrowser, method: string, path: string, body?: unknown) =>
    browser.visit(`${stack.origin}${path}`, {
      method,
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });

  const ingest = (token: string) =>
    fetch(`${stack.origin}/api/ingest/readings`, {
      method: 'POST',
      headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
      body: JSON.stringify({
        readings: [
          { parameter: 'temperature', value: 25.5, unit: '°C', measuredAt: new Date().toISOString() },
        ],
      }),
    });

  const subscription = (label: string) => {
    const endpoint = `https://push.example.test/send/${randomBytes(24).toString('base64url')}`;
    const keys = {
      p256dh: `B${randomBytes(64).toString('base64url')}`.slice(0, 87),
      auth: randomBytes(16).toString('base64url'),
    };
    keep(`${label}: push endpoint`, endpoint);
    keep(`${label}: push auth secret`, keys.auth);
    return { endpoint, keys };
  };

  beforeAll(async () => {
    stack = await startTestStack({
      logger: createLogger('debug', { write: (line: string) => void lines.push(line) }),
    });
    const { db, pool } = stack.database;
    const company = await createCompany(db);
    const tank = await createTank(db, { companyId: company.id });
    const admin = await createPerson(db, { companyId: company.id, role: 'admin', issuer: stack.idp.issuer });
    enrol(stack, admin);

    // Staff sign in through the provider.
    const adminBrowser = new HttpBrowser();
    await signInKeeping(adminBrowser, admin, 'admin');

    // A client accepts an invitation by its link.
    const newcomer: TestPerson = {
      id: '',
      companyId: '',
      role: 'owner',
      sub: 'sub-log-newcomer',
      email: 'log-newcomer@example.test',
      name: 'Nina Newcomer',
      password: `pw-${randomBytes(9).toString('base64url')}`,
    };
    enrol(stack, newcomer);
    statuses.invite = (
      await call(adminBrowser, 'POST', '/api/invitations', {
        role: 'owner',
        email: newcomer.email,
        tankId: tank.id,
      })
    ).status;
    const mail = await stack.mail.waitFor((m) => m.to.includes(newcomer.email));
    const link = /https?:\/\/\S+\/auth\/invitation\/[\w-]+/.exec(mail.text)?.[0] ?? '';
    const invitationToken = link.slice(link.lastIndexOf('/') + 1);
    keep('invitation token', invitationToken);
    keep('invitation token hash', hashToken(invitationToken));
    const clientBrowser = new HttpBrowser();
    await clientBrowser.visit(link);
    keep('invitation pre-login cookie', clientBrowser.cookies(stack.origin).get('bw_login'));
    statuses.acceptedLanding = (await signInKeeping(clientBrowser, newcomer, 'client')).endsWith('/tanks')
      ? 1
      : 0;

    // A device posts readings with its token; another caller tries a wrong one.
    const device = await deviceFor(db, admin, tank.id);
    keep('device token', device.token);
    keep('device token hash', hashToken(device.token));
    const wrongToken = randomBytes(32).toString('base64url');
    keep('wrong device token', wrongToken);
    keep('wrong device token hash', hashToken(wrongToken));
    statuses.ingest = (await ingest(device.token)).status;
    statuses.wrongToken = (await ingest(wrongToken)).status;

    // A push subscription is saved.
    statuses.push = (
      await call(clientBrowser, 'POST', '/api/push/subscriptions', subscription('saved subscription'))
    ).status;

    // Failing queries whose bound parameters are secrets: a push subscription refused by the
    // database, a device-token look-up and an invitation look-up on a damaged table, and an
    // invitation insert (with its e-mail address) refused by the database.
    await pool.query(`create function refuse_row() returns trigger language plpgsql as $$
      begin raise exception 'refused by the log test'; end $$`);
    await pool.query(`create trigger refuse_push before insert on push_subscriptions
      for each row execute function refuse_row()`);
    statuses.failedPush = (
      await call(clientBrowser, 'POST', '/api/push/subscriptions', subscription('refused subscription'))
    ).status;
    await pool.query('alter table devices rename column revoked_at to revoked_at_hidden');
    statuses.failedDeviceLookup = (await ingest(device.token)).status;
    await pool.query('alter table devices rename column revoked_at_hidden to revoked_at');
    await pool.query('alter table invitations rename column revoked_at to revoked_at_hidden');
    statuses.failedInvitationLookup = (await new HttpBrowser().visit(link)).status;
    await pool.query('alter table invitations rename column revoked_at_hidden to revoked_at');
    await pool.query(`create trigger refuse_invitation before insert on invitations
      for each row execute function refuse_row()`);
    const refusedEmail = 'refused-invitee@example.test';
    keep('e-mail of a refused invitation', refusedEmail);
    statuses.failedInvite = (
      await call(adminBrowser, 'POST', '/api/invitations', { role: 'technician', email: refusedEmail })
    ).status;

    // pino-http writes its line when the response finishes, a moment after the client has it.
    const deadline = Date.now() + 5_000;
    while (!lines.join('').includes('"url":"/api/invitations"') || lines.length < 10) {
      if (Date.now() > deadline) break;
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
    log = lines.join('');
  });
  afterAll(() => stack.close());

  it('went through the flow it claims to check', () => {
    expect(statuses).toEqual({
      invite: 201,
      acceptedLanding: 1,
      ingest: 200,
      wrongToken: 401,
      push: 201,
      failedPush: 500,
      failedDeviceLookup: 500,
      failedInvitationLookup: 500,
      failedInvite: 500,
    });
  });

  it('logged the requests, with the paths but not the secrets in their URLs', () => {
    expect(log).toContain('"url":"/auth/invitation/[token]"');
    expect(log).toMatch(/"url":"\/auth\/callback\?code=\[redacted\]&state=\[redacted\]/);
  });

  it('logged each failed query with its error code and SQL, without its parameters', () => {
    const failures = lines
      .map(
        (line) => JSON.parse(line) as { err?: { code?: string; query?: string; cause?: { code?: string } } },
      )
      .filter((entry) => entry.err?.query)
      .map((entry) => entry.err!.cause?.code ?? entry.err!.code);
    // P0001: raise_exception; 42703: undefined_column (PostgreSQL, Appendix A "Error Codes").
    expect(failures.filter((code) => code === 'P0001')).toHaveLength(2);
    expect(failures.filter((code) => code === '42703')).toHaveLength(2);
    expect(log).not.toMatch(/"params"|"parameters"|\nparams:|\\nparams:/);
  });

  it('holds none of the secrets the flow handled', () => {
    expect(secrets.size).toBeGreaterThan(20);
    const leaked = [...secrets].filter(([, value]) => log.includes(value)).map(([name]) => name);
    expect(leaked).toEqual([]);
  });

  it('holds no e-mail address at all', () => {
    expect(log.match(/[\w.+-]+@[\w-]+\.[\w.-]+/g) ?? []).toEqual([]);
  });
});
