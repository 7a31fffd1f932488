import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { days } from '../helpers/clock';
import { createCompany, createPerson, createTank, type TestPerson } from '../helpers/factories';
import { HttpBrowser, location } from '../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';

describe('invitations', () => {
  let stack: TestStack;
  let admin: TestPerson;
  let adminBrowser: HttpBrowser;
  let tank: { id: string; name: string };
  let counter = 0;

  beforeAll(async () => {
    stack = await startTestStack();
    const company = await createCompany(stack.database.db, { name: 'Seagrass Test Services' });
    admin = await createPerson(stack.database.db, {
      companyId: company.id,
      role: 'admin',
      issuer: stack.idp.issuer,
    });
    tank = await createTank(stack.database.db, { companyId: company.id, name: 'Surgery reef' });
    adminBrowser = new HttpBrowser();
    await signIn(stack, adminBrowser, admin);
  });
  afterAll(() => stack.close());
  afterEach(() => stack.clock.reset());

  /** A person the provider knows but the app does not yet. */
  function newcomer(): TestPerson {
    counter += 1;
    const person: TestPerson = {
      id: '',
      companyId: '',
      role: 'owner',
      sub: `sub-newcomer-${counter}`,
      email: `newcomer-${counter}@example.test`,
      name: `Newcomer ${counter}`,
      password: `pw-newcomer-${counter}-x`,
    };
    return person;
  }

  async function invite(body: Record<string, unknown>) {
    const res = await adminBrowser.visit(`${stack.origin}/api/invitations`, {
      method: 'POST',
      headers: { ...stack.sameOrigin, 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });
    return { status: res.status, body: (await res.json()) as Record<string, unknown> };
  }

  async function linkSentTo(email: string) {
    const mail = await stack.mail.waitFor((m) => m.to.includes(email));
    const link = /https?:\/\/\S+\/auth\/invitation\/[\w-]+/.exec(mail.text)?.[0];
    if (!link) throw new Error(`no invitation link in:\n${mail.text}`);
    return { mail, link };
  }

  async function accept(link: string, person: TestPerson) {
    const browser = new HttpBrowser();
    const opened = await browser.visit(link);
    if (location(opened, stack.origin) !== `${stack.origin}/auth/login`) {
      return { browser, landing: location(opened, stack.origin) };
    }
    return { browser, landing: await signIn(stack, browser, person) };
  }

  it('e-mails a client a single-use link that makes them an owner of the tank', async () => {
    const person = newcomer();
    const created = await invite({
      role: 'owner',
      email: person.email.toUpperCase(),
      name: 'Nell',
      tankId: tank.id,
    });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      status: 'pending',
      emailSent: true,
      email: person.email,
      tank: { name: 'Surgery reef' },
    });

    const { mail, link } = await linkSentTo(person.email);
    expect(mail.subject).toBe('Your Brinewatch invitation from Seagrass Test Services');
    expect(mail.html).toContain('Accept the invitation');

    const { browser, landing } = await accept(link, person);
    expect(landing).toBe(`${stack.origin}/tanks`);
    const me = await (await browser.visit(`${stack.origin}/api/me`)).json();
    expect(me).toMatchObject({
      role: 'owner',
      email: person.email,
      company: { name: 'Seagrass Test Services' },
    });
    const tanks = await (await browser.visit(`${stack.origin}/api/tanks`)).json();
    expect(tanks).toEqual([expect.objectContaining({ id: tank.id })]);

    const second = await accept(link, newcomer());
    expect(second.landing).toBe(`${stack.origin}/invitation-invalid`);
  });

  it('makes an invited staff member a technician', async () => {
    const person = newcomer();
    await invite({ role: 'technician', email: person.email });
    const { link } = await linkSentTo(person.email);
    const { browser } = await accept(link, person);
    expect(await (await browser.visit(`${stack.origin}/api/me`)).json()).toMatchObject({
      role: 'technician',
    });
  });

  it('refuses a link after it expires', async () => {
    const person = newcomer();
    await invite({ role: 'owner', email: person.email, tankId: tank.id });
    const { link } = await linkSentTo(person.email);
    stack.clock.advance(days(7) + 1000);

    const { landing } = await accept(link, person);

    expect(landing).toBe(`${stack.origin}/invitation-invalid`);
  });

  it('refuses a link that expires between opening it and finishing the sign-in', async () => {
    const person = newcomer();
    await invite({ role: 'owner', email: person.email, tankId: tank.id });
    const { link } = await linkSentTo(person.email);
    const browser = new HttpBrowser();
    await browser.visit(link);
    // The expiry is checked again when the sign-in completes; moving the app's clock a week on
    // would also expire the provider's ID token, so the row's expiry moves instead.
    await stack.database.pool.query(
      `update invitations set expires_at = now() - interval '1 second' where email = $1`,
      [person.email],
    );

    const landing = await signIn(stack, browser, person);

    expect(landing).toBe(`${stack.origin}/no-access`);
    expect((await browser.visit(`${stack.origin}/api/me`)).status).toBe(401);
  });

  it('refuses a revoked link', async () => {
    const person = newcomer();
    const created = await invite({ role: 'owner', email: person.email, tankId: tank.id });
    const { link } = await linkSentTo(person.email);
    const revoked = await adminBrowser.visit(`${stack.origin}/api/invitations/${String(created.body.id)}`, {
      method: 'DELETE',
      headers: stack.sameOrigin,
    });
    expect(revoked.status).toBe(204);

    expect((await accept(link, person)).landing).toBe(`${stack.origin}/invitation-invalid`);
  });

  it('explains what is wrong with an invitation that does not validate', async () => {
    const res = await invite({ role: 'owner', email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body).toMatchObject({
      error: {
        code: 'invalid_request',
        issues: expect.arrayContaining([
          expect.objectContaining({ path: 'body.email' }),
          expect.objectContaining({ path: 'body.tankId' }),
        ]),
      },
    });
  });

  it('still creates the invitation when the mail server is down, and says the e-mail was not sent', async () => {
    await stack.mail.pause();
    try {
      const res = await invite({ role: 'technician', email: 'offline@example.test' });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ emailSent: false, status: 'pending' });
    } finally {
      await stack.mail.resume();
    }
  });
});
