import { request as httpsRequest } from 'node:https';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, inject, it, onTestFinished } from 'vitest';
import type { UrgentRequestView, UrgentSettingsView } from '@shared/schemas/urgent-requests';
import { defaultFirstAid, licensedPracticeNote } from '@shared/urgent/categories';
import type { ReceivedPush } from '../../api/dev/push-service';
import { demoId } from '../../api/dev/seed/index';
import {
  apiInPage,
  artifactsDir,
  type BrowserSession,
  expectAxeClean,
  checkAtBothWidths,
  openBrowser,
  screenshot,
  signInAt,
} from '../helpers/browser';

/*
 * An urgent visit from the owner's phone to the technician on call and back: the owner, at 390 px,
 * asks for help with a leak, reads the first-aid steps and cautions before anything is sent, sends
 * with a photo; the technician on call (the demo's shift covers now) gets a high-urgency push and an
 * e-mail, acknowledges with an arrival time from a second browser, and writes in the conversation;
 * the owner's page follows both without a reload.
 */

const livingRoomReef = demoId('ashdown-reef');
const ownerEmail = 'helen@ashdown-home.test';
const onCallEmail = 'priya@driftglass.test';
/** The event stream marks the page stale; on a loaded machine the refetch can take a while. */
const liveWithinMs = 30_000;

interface Mail {
  to: string[];
  subject: string;
  text: string;
  headers: Record<string, string>;
}

/** What the push stand-in received, read over its own HTTPS with its self-signed certificate. */
function receivedPushes(): Promise<ReceivedPush[]> {
  const { origin, caCertPem } = inject('pushStandIn');
  return new Promise((resolve, reject) => {
    httpsRequest(`${origin}/api/received`, { ca: caCertPem }, (response) => {
      let body = '';
      response.setEncoding('utf8');
      response.on('data', (chunk: string) => (body += chunk));
      response.on('end', () => resolve(JSON.parse(body) as ReceivedPush[]));
    })
      .on('error', reject)
      .end();
  });
}

async function mailbox(): Promise<Mail[]> {
  return (await (await fetch(`${inject('mailboxUrl')}/api/messages`)).json()) as Mail[];
}

describe('an urgent visit request in the browser', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('goes from the owner’s phone to the technician on call and back, live', async () => {
    const description = `Water on the floor under the cabinet ${Date.now().toString(36)}; the sump looks lower than usual.`;

    // The technician on call has this browser's stand-in push subscription.
    const tech = await signInAt(await session.newPage('desktop'), '/console/urgent', onCallEmail);
    // She goes on call for this test (an admin puts her on the roster through the API) and comes off
    // it at the end, whatever happens, so other tests find the roster as the demo leaves it.
    const technicianId = (await apiInPage<{ id: string }>(tech, 'GET', '/me')).id;
    const admin = await signInAt(await session.newPage('desktop'), '/console/alerts', 'mara@driftglass.test');
    const shifts = await apiInPage<Array<{ id: string; user: { id: string } }>>(admin, 'POST', '/on-call', {
      userId: technicianId,
      startsAt: new Date(Date.now() - 60 * 60_000).toISOString(),
      endsAt: new Date(Date.now() + 6 * 60 * 60_000).toISOString(),
    });
    const shift = shifts.find((entry) => entry.user.id === technicianId)!;
    onTestFinished(async () => {
      await apiInPage(admin, 'DELETE', `/on-call/${shift.id}`);
      await admin.close();
    });
    const { subscription } = inject('pushStandIn');
    await apiInPage(tech, 'POST', '/push/subscriptions', {
      endpoint: subscription.endpoint,
      keys: subscription.keys,
    });

    // The owner, on a phone, has two tanks: the dashboard's button asks which one.
    const owner = await signInAt(await session.newPage('phone'), '/tanks', ownerEmail);
    const before = await apiInPage<UrgentRequestView[]>(
      owner,
      'GET',
      `/tanks/${livingRoomReef}/urgent-requests`,
    );
    await owner.getByRole('heading', { level: 2, name: 'Living room reef' }).waitFor();
    await checkAtBothWidths(owner, 'urgent-dashboard');
    await owner.getByRole('button', { name: 'Request an urgent visit' }).click();
    const which = owner.getByRole('dialog', { name: 'Which tank needs help?' });
    await which.getByRole('link', { name: "Kids' river tank" }).waitFor();
    await expectAxeClean(owner, 'the tank question');
    await screenshot(owner, 'urgent-which-tank-phone');
    await which.getByRole('link', { name: 'Living room reef' }).click();
    await owner.waitForURL(`**/tanks/${livingRoomReef}/urgent`);

    // "Equipment stopped" offers the tank's own items, where each is plugged in, and the map.
    const form = owner.getByRole('form', { name: 'Request an urgent visit' });
    await form.getByRole('radio', { name: /^Equipment stopped/ }).check();
    await form.getByLabel('Which item stopped?').selectOption(demoId('equipment:ashdown-reef:return'));
    await form.getByText('is plugged into', { exact: false }).waitFor();
    expect(await form.getByText('is plugged into', { exact: false }).textContent()).toBe(
      'Return pump in the sump is plugged into outlet 1 on board A.',
    );
    expect(
      await form
        .getByRole('link', { name: 'See the power board map: what each outlet feeds' })
        .getAttribute('href'),
    ).toBe(`/tanks/${livingRoomReef}?section=equipment`);
    await form.getByText(defaultFirstAid.equipment.steps[0]!).waitFor();
    await expectAxeClean(owner, 'the form for stopped equipment');
    await form.getByLabel('Which item stopped?').scrollIntoViewIfNeeded();
    await screenshot(owner, 'urgent-equipment-phone');

    // Choosing "leak" shows its first aid at once, before anything is sent.
    await form.getByRole('radio', { name: /^Water leak or flood/ }).check();
    const firstAid = form.getByRole('region', { name: /^First aid while you wait/ });
    await firstAid.waitFor();
    const steps = firstAid.getByRole('list').last();
    expect(await steps.getByRole('listitem').allTextContents()).toEqual(
      defaultFirstAid.leak.steps.map((step, index) => `${index + 1}${step}`),
    );
    const cautions = firstAid.getByRole('note', { name: 'Safety first' });
    for (const caution of defaultFirstAid.leak.cautions) await cautions.getByText(caution).waitFor();
    await firstAid.getByText(licensedPracticeNote).waitFor();
    expect(
      await apiInPage<UrgentRequestView[]>(owner, 'GET', `/tanks/${livingRoomReef}/urgent-requests`),
    ).toHaveLength(before.length);
    await checkAtBothWidths(owner, 'urgent-first-aid');

    // The details, kept on the phone as they are typed: a reload loses nothing.
    await form.getByLabel('What do you see?').fill(description);
    const photo = await sharp({
      create: { width: 96, height: 64, channels: 3, background: '#3fb8af' },
    })
      .png()
      .toBuffer();
    await form
      .getByLabel(/^Photos/)
      .setInputFiles({ name: 'floor.png', mimeType: 'image/png', buffer: photo });
    const photos = form.getByRole('list', { name: 'Photos to send' });
    await photos.getByText('Uploaded').waitFor();
    await form.getByRole('radio', { name: 'Yes', exact: true }).check();
    await form
      .getByLabel('How to get in (optional)')
      .fill('Front door; the neighbour at number 12 has a key.');
    await form.getByLabel('Phone number').fill('+44 20 7946 0958');
    await form.getByLabel('Best time to reach you (optional)').fill('Any time today');
    await owner.waitForTimeout(600);
    await owner.reload();
    await owner.getByText('We kept what you typed on this device').waitFor();
    expect(await form.getByLabel('What do you see?').inputValue()).toBe(description);
    expect(await form.getByRole('radio', { name: /^Water leak or flood/ }).isChecked()).toBe(true);
    expect(await form.getByLabel('Phone number').inputValue()).toBe('+44 20 7946 0958');
    await photos.getByRole('img', { name: 'Attached 1 of 1: floor.png' }).waitFor();
    await firstAid.waitFor();

    // The call-out fee, before sending.
    await form.getByText('Call-out fee: £85.00').waitFor();
    await form.getByText('The call-out fee is charged once a technician comes out.').waitFor();
    await checkAtBothWidths(owner, 'urgent-form');

    await form.getByRole('button', { name: 'Send the urgent request' }).click();
    await owner.waitForURL(/\/urgent\/[0-9a-f-]{36}$/);
    const requestId = new URL(owner.url()).pathname.split('/').at(-1)!;
    await owner.getByText('Your request is sent.', { exact: false }).waitFor();
    const progress = owner.getByRole('list', { name: 'Progress of the request' });
    expect(await progress.locator('[aria-current="step"]').textContent()).toContain('Requested');
    const sent = await apiInPage<UrgentRequestView>(owner, 'GET', `/urgent-requests/${requestId}`);
    expect(sent).toMatchObject({
      tankId: livingRoomReef,
      category: 'leak',
      description,
      someoneOnSite: true,
      phone: '+44 20 7946 0958',
      status: 'requested',
      callOutFeeCents: 8500,
      currency: 'GBP',
    });
    expect(sent.photos).toHaveLength(1);
    await owner.getByRole('list', { name: 'Photos sent with the request' }).getByRole('img').waitFor();
    await checkAtBothWidths(owner, 'urgent-status-requested');

    // The technician on call is told at once: a high-urgency push and an e-mail.
    await expect
      .poll(
        async () =>
          (await receivedPushes()).find(
            (push) => (push.payload as { url?: string } | null)?.url === `/urgent/${requestId}`,
          ),
        { timeout: 60_000, interval: 1000 },
      )
      .toMatchObject({
        status: 201,
        urgency: 'high',
        payload: {
          title:
            'Urgent visit requested: Water leak or flood at Living room reef (Ashdown family home — living room)',
        },
      });
    await expect
      .poll(
        async () =>
          (await mailbox()).find(
            (mail) => mail.to.includes(onCallEmail) && mail.headers['x-brinewatch-urgent'] === requestId,
          )?.subject,
        { timeout: 60_000, interval: 1000 },
      )
      .toContain('Urgent visit requested: Water leak or flood');

    // The board: the new request waits for acknowledgement, ticking against the target.
    await tech.goto('/console/urgent');
    const mine = tech
      .getByRole('article')
      .filter({ hasText: 'Living room reef' })
      .filter({ hasText: 'Water leak or flood' });
    await mine.getByText('Needs acknowledging').waitFor();
    await mine.getByText(/^Waiting/).waitFor();
    await tech.getByRole('link', { name: /^Urgent \d+ open$/ }).waitFor();
    await checkAtBothWidths(tech, 'urgent-board', 'desktop');

    // Acknowledged with an arrival time, in a second browser.
    await mine.getByRole('link', { name: 'Living room reef' }).click();
    await tech.waitForURL(`**/urgent/${requestId}`);
    await tech.getByRole('button', { name: 'Acknowledge' }).click();
    const acknowledge = tech.getByRole('dialog', { name: 'Acknowledge the request' });
    await acknowledge.getByRole('button', { name: 'Arrival in +1 h' }).click();
    expect(await acknowledge.getByLabel('Expected arrival').inputValue()).toMatch(
      /^\d{4}-\d\d-\d\dT\d\d:\d\d$/,
    );
    await acknowledge
      .getByLabel('Note (optional)')
      .fill('Switch off at the main board if it is dry; I am bringing a pump.');
    await expectAxeClean(tech, 'the acknowledge dialog');
    await screenshot(tech, 'urgent-acknowledge-desktop');
    await acknowledge.getByRole('button', { name: 'Acknowledge' }).click();
    await acknowledge.waitFor({ state: 'detached' });
    await tech.getByRole('button', { name: 'Assign technician' }).waitFor();
    const acknowledged = await apiInPage<UrgentRequestView>(tech, 'GET', `/urgent-requests/${requestId}`);
    expect(acknowledged.status).toBe('acknowledged');
    const etaMinutes = (Date.parse(acknowledged.eta!) - Date.now()) / 60_000;
    expect(etaMinutes).toBeGreaterThan(50);
    expect(etaMinutes).toBeLessThan(62);

    // The owner's page follows without a reload.
    await expect
      .poll(() => progress.locator('[aria-current="step"]').textContent(), { timeout: liveWithinMs })
      .toContain('Acknowledged');
    await owner.getByText('Expected arrival').waitFor();
    // In the page itself: the closed notification panel in the header may hold the same words.
    await owner.getByRole('main').getByText('I am bringing a pump.', { exact: false }).waitFor();

    // The tank's page leads to the open request, with a new one still one tap away.
    const tankPage = await owner.context().newPage();
    await tankPage.goto(`/tanks/${livingRoomReef}`);
    await tankPage.getByRole('link', { name: /^Urgent request/ }).waitFor();
    await tankPage.getByRole('link', { name: 'Request an urgent visit' }).waitFor();
    await expectAxeClean(tankPage, 'the tank page with an open request');
    await screenshot(tankPage, 'urgent-tank-header-phone');
    await tankPage.close();

    // A line from the technician in the conversation reaches the owner's page too.
    const line = `On my way from the previous client, about an hour ${Date.now().toString(36)}.`;
    const composer = tech.getByRole('form', { name: 'Write a message' });
    await composer.getByLabel('Message', { exact: true }).fill(line);
    await composer.getByRole('button', { name: 'Send' }).click();
    await owner.getByRole('log').getByText(line).waitFor({ timeout: liveWithinMs });
    // The thread scrolls inside itself: pictured as it stands on the phone, not stretched to a full page.
    await owner
      .getByRole('region', { name: 'Messages', exact: true })
      .screenshot({ path: `${artifactsDir}/urgent-status-messages-phone.png` });
    await checkAtBothWidths(owner, 'urgent-status-acknowledged');
    await checkAtBothWidths(tech, 'urgent-staff-request', 'desktop');

    // Closed again, so the shared e2e database keeps no open request and no stray subscription;
    // the owner's page shows the reason and the advice.
    await apiInPage(tech, 'POST', `/urgent-requests/${requestId}/moves`, {
      to: 'declined',
      reason: 'The leak was the top-off reservoir, which the owner has emptied.',
      advice: 'Leave the top-off pump unplugged until the next visit and top up by hand once a day.',
    });
    await owner.getByText('We cannot come out for this request').waitFor({ timeout: liveWithinMs });
    await owner.getByRole('main').getByText('Leave the top-off pump unplugged', { exact: false }).waitFor();
    await checkAtBothWidths(owner, 'urgent-status-declined');
    await apiInPage(tech, 'DELETE', '/push/subscriptions', { endpoint: subscription.endpoint }).catch(
      () => undefined,
    );
  });

  it('lets an admin rewrite a category’s first aid and reset it to the default', async () => {
    const admin = await signInAt(
      await session.newPage('desktop'),
      '/console/urgent/settings',
      'mara@driftglass.test',
    );
    const form = admin.getByRole('form', { name: 'Urgent visit settings' });
    // The fee is set on the price list now; the settings page names it and links there.
    await form.getByText('£85.00').waitFor();
    expect(await form.getByRole('link', { name: 'price list' }).getAttribute('href')).toBe(
      '/console/billing',
    );
    const leak = form.getByRole('region', { name: 'Water leak or flood' });
    await leak.getByText('Default text (common practice)').waitFor();
    await checkAtBothWidths(admin, 'urgent-settings', 'desktop');

    // The company's own first step, then back to the default.
    const ownStep = 'Call us on the number on the cabinet door before touching anything.';
    const steps = leak.getByLabel('Steps, in order');
    await steps.fill([ownStep, ...defaultFirstAid.leak.steps].join('\n'));
    await leak.getByText('Your company’s text').waitFor();
    await form.getByRole('button', { name: 'Save settings' }).click();
    await form.getByText('Saved.', { exact: false }).waitFor();
    const custom = await apiInPage<UrgentSettingsView>(admin, 'GET', '/urgent-settings');
    expect(custom.firstAid.leak).toMatchObject({
      custom: true,
      steps: [ownStep, ...defaultFirstAid.leak.steps],
    });

    await leak.getByRole('button', { name: 'Reset to default for Water leak or flood' }).click();
    await leak.getByText('Default text (common practice)').waitFor();
    await form.getByRole('button', { name: 'Save settings' }).click();
    await form.getByText('Saved.', { exact: false }).waitFor();
    const reset = await apiInPage<UrgentSettingsView>(admin, 'GET', '/urgent-settings');
    expect(reset.firstAid.leak).toMatchObject({ custom: false, steps: defaultFirstAid.leak.steps });
  });
});
