import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MessagePage } from '@shared/schemas/conversations';
import { demoTankId } from '../../api/dev/seed/ids';
import {
  apiInPage,
  artifactsDir,
  type BrowserSession,
  expectAxeClean,
  expectNoSidewaysScroll,
  openBrowser,
  screenshot,
  signInAt,
  viewports,
} from '../helpers/browser';

/*
 * A tank's conversation across two browsers: the owner of the waiting room reef, on a 390 px phone,
 * writes with a photo; a technician's inbox, open on a desktop, shows it from the live event stream
 * without a reload; the technician adds an internal note and replies; the owner's page shows the
 * reply, never the note. A send without a connection waits in the composer and goes once, when the
 * connection is back.
 */

const waitingRoomReef = demoTankId('quayside-reef');
/**
 * How long to wait for a live update before calling it missing. What this test proves is that it
 * arrives without a reload; how fast is measured in tests/bench/live-messages.bench.ts, never here.
 */
const liveWithinMs = 30_000;

describe('conversations in the browser', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('carries a message with a photo to the staff inbox live, and the reply back, keeping notes to staff', async () => {
    const run = Date.now().toString(36);
    const question = `The return pump is humming louder since this morning (${run}). Is that normal?`;
    const note = `Pump impeller likely worn, bring a spare (${run})`;
    const reply = `Thanks Felix, we will look at it on Thursday (${run}). See https://example.org/pumps`;

    // The technician's inbox is open before anything is written.
    const staff = await signInAt(await session.newPage('desktop'), '/console/inbox', 'tomas@driftglass.test');
    await staff.getByRole('heading', { level: 1, name: 'Inbox' }).waitFor();

    // The owner has one tank: the header's Messages leads straight to its conversation.
    const owner = await signInAt(await session.newPage('phone'), '/tanks', 'felix@quayside-dental.test');
    await owner.getByRole('heading', { level: 2, name: 'Waiting room reef' }).waitFor();
    await owner
      .getByRole('link', { name: /^Messages/ })
      .first()
      .click();
    await owner.waitForURL(`**/tanks/${waitingRoomReef}/messages`);
    await owner.getByRole('heading', { level: 1, name: /Waiting room reef/ }).waitFor();
    const composer = owner.getByRole('form', { name: 'Write a message' });
    await composer.waitFor();
    expect(await owner.getByRole('checkbox', { name: /Internal note/ }).count()).toBe(0);

    // A message with a photo.
    const picture = await sharp({
      create: { width: 64, height: 48, channels: 3, background: { r: 20, g: 120, b: 140 } },
    })
      .png()
      .toBuffer();
    await composer
      .getByLabel('Add photos')
      .setInputFiles({ name: 'pump.png', mimeType: 'image/png', buffer: picture });
    await composer.getByText('Ready').waitFor();
    await composer.getByLabel('Message', { exact: true }).fill(question);
    await composer.getByRole('button', { name: 'Send' }).click();
    const sentAt = Date.now();
    const ownerLog = owner.getByRole('log');
    await ownerLog.getByText(question).waitFor();

    // The inbox shows it without a reload, waiting for an answer, with the unread count in the header.
    const row = staff.getByRole('article').filter({ hasText: 'Waiting room reef' });
    await row.getByText(question).waitFor({ timeout: liveWithinMs });
    console.info(`the inbox showed the message ${Date.now() - sentAt} ms after Send`);
    await row.getByText(/^Waiting (less than a minute|\d+ min)/).waitFor();
    await row.getByText('1 unread').waitFor();
    await staff.getByRole('link', { name: /^Messages, \d+ unread$/ }).waitFor();
    await ownerLog.getByRole('img', { name: 'Attachment 1 of 1 from You' }).waitFor();
    // Ready for the next line: empty, and the cursor back in the box.
    expect(await composer.getByLabel('Message', { exact: true }).inputValue()).toBe('');
    expect(await owner.evaluate(() => document.activeElement?.tagName)).toBe('TEXTAREA');
    await expectNoSidewaysScroll(owner, 'the owner’s thread on a phone');
    await expectAxeClean(owner, 'the owner’s thread on a phone');
    await screenshot(owner, 'conversations-owner-phone');
    // What the phone shows without scrolling: the newest line above the composer.
    await owner.screenshot({ path: path.join(artifactsDir, 'conversations-owner-phone-screen.png') });

    await expectAxeClean(staff, 'the staff inbox');
    await screenshot(staff, 'conversations-staff-inbox-desktop');

    // The technician opens it, adds an internal note, then replies.
    await row.getByRole('link', { name: 'Waiting room reef' }).click();
    await staff.waitForURL(`**/tanks/${waitingRoomReef}/messages`);
    const staffLog = staff.getByRole('log');
    await staffLog.getByText(question).waitFor();
    await staffLog.getByRole('img', { name: /Attachment 1 of 1 from Felix/ }).waitFor();
    const staffComposer = staff.getByRole('form', { name: /Write a/ });
    await staffComposer.getByRole('checkbox', { name: 'Internal note (staff only)' }).check();
    await staffComposer.getByLabel('Internal note — staff only', { exact: true }).fill(note);
    await staff.screenshot({ path: path.join(artifactsDir, 'conversations-staff-note-desktop-screen.png') });
    await staffComposer.getByRole('button', { name: 'Add note' }).click();
    const noteCard = staffLog.getByRole('article', { name: /^Internal note from You/ });
    await noteCard.getByText(note).waitFor();
    expect(await noteCard.textContent()).toContain('Internal note — staff only');
    await staffComposer.getByRole('checkbox', { name: 'Internal note (staff only)' }).uncheck();
    await staffComposer.getByLabel('Message', { exact: true }).fill(reply);
    await staffComposer.getByRole('button', { name: 'Send' }).click();
    await staffLog.getByText(/we will look at it on Thursday/).waitFor();
    await expectAxeClean(staff, 'the staff thread');
    await screenshot(staff, 'conversations-staff-thread-desktop');

    // The owner's open page shows the reply from the event stream, the link clickable, no note.
    await ownerLog.getByText(/we will look at it on Thursday/).waitFor({ timeout: liveWithinMs });
    const link = ownerLog.getByRole('link', { name: /example\.org\/pumps/ });
    expect(await link.getAttribute('target')).toBe('_blank');
    expect(await link.getAttribute('rel')).toBe('noopener noreferrer');
    expect(await owner.getByText(note).count()).toBe(0);
    expect(await owner.getByText('Internal note — staff only').count()).toBe(0);
    const asOwner = await apiInPage<MessagePage>(
      owner,
      'GET',
      `/tanks/${waitingRoomReef}/conversation/messages`,
    );
    expect(asOwner.messages.some((m) => m.body === note || m.kind === 'internal-note')).toBe(false);
    await expectAxeClean(owner, 'the owner’s thread with the reply');
    await screenshot(owner, 'conversations-owner-reply-phone');
    await owner.screenshot({ path: path.join(artifactsDir, 'conversations-owner-reply-phone-screen.png') });

    // Away from the thread, a new line shows as unread on the dashboard's tank card and in the
    // header, live; the tank page leads to it, and reading it clears the count.
    await owner.goto('/tanks');
    // The tank's own card (titled by the tank), not a care tip card that mentions the tank.
    const card = owner
      .getByRole('article')
      .filter({ has: owner.getByRole('heading', { level: 2, name: 'Waiting room reef', exact: true }) });
    await card.waitFor();
    await staffComposer
      .getByLabel('Message', { exact: true })
      .fill(`Bring the pump's model number if you can (${run})`);
    await staffComposer.getByRole('button', { name: 'Send' }).click();
    await card.getByRole('link', { name: '1 new message' }).waitFor({ timeout: liveWithinMs });
    await owner.getByRole('link', { name: 'Messages, 1 unread' }).waitFor();
    await expectAxeClean(owner, 'the dashboard with an unread message');
    await screenshot(owner, 'conversations-dashboard-unread-phone');
    await owner.goto(`/tanks/${waitingRoomReef}`);
    const tankMessages = owner.getByRole('link', { name: 'Messages 1 unread' });
    await tankMessages.waitFor();
    await tankMessages.click();
    await owner.waitForURL(`**/tanks/${waitingRoomReef}/messages`);
    await ownerLog.getByText(/model number/).waitFor();
    await owner.getByRole('link', { name: 'Messages', exact: true }).waitFor({ timeout: liveWithinMs });
  });

  it("asks an owner of several tanks which tank's conversation to open", async () => {
    const riverTank = demoTankId('ashdown-river');
    const owner = await signInAt(await session.newPage('phone'), '/tanks', 'helen@ashdown-home.test');
    await owner
      .getByRole('banner')
      .getByRole('button', { name: /^Messages/ })
      .click();
    const which = owner.getByRole('dialog', { name: "Which tank's conversation?" });
    await which.waitFor();
    expect(await which.getByRole('link').count()).toBeGreaterThan(1);
    await expectAxeClean(owner, 'the choice of conversation');
    await screenshot(owner, 'conversations-choose-tank-phone');
    await which.getByRole('link', { name: /^Kids' river tank/ }).click();
    await owner.waitForURL(`**/tanks/${riverTank}/messages`);
    await owner.getByRole('form', { name: 'Write a message' }).waitFor();
  });

  it('opens a long conversation at its end and pages back to its start on request', async () => {
    const riverTank = demoTankId('ashdown-river');
    const owner = await signInAt(await session.newPage('desktop'), '/tanks', 'helen@ashdown-home.test');
    for (let n = 1; n <= 32; n += 1) {
      await apiInPage(owner, 'POST', `/tanks/${riverTank}/conversation/messages`, {
        body: `River tank note number ${n}`,
      });
    }
    await owner.goto(`/tanks/${riverTank}/messages`);
    const log = owner.getByRole('log');
    await log.getByText('River tank note number 32', { exact: true }).waitFor();
    expect(await log.getByText('River tank note number 1', { exact: true }).count()).toBe(0);
    // Opened at the end: the newest line is on screen.
    expect(await log.getByText('River tank note number 32', { exact: true }).isVisible()).toBe(true);
    const inView = async (text: string) => {
      const box = await log.getByText(text, { exact: true }).boundingBox();
      return box !== null && box.y >= 0 && box.y + box.height <= viewports.desktop.height;
    };
    expect(await inView('River tank note number 32')).toBe(true);

    await owner.getByRole('button', { name: 'Show earlier messages' }).click();
    await log.getByText('River tank note number 1', { exact: true }).waitFor();
    await owner.getByText('Start of the conversation').waitFor();
    // The older lines went in above; the line that was at the top stays where the reader was.
    expect(await inView('River tank note number 3')).toBe(true);
    await expectAxeClean(owner, 'a long thread');
  });

  it('keeps a message written without a connection and sends it once when the connection is back', async () => {
    const words = `Top-off reservoir is empty, refilled it (${Date.now().toString(36)})`;
    const owner = await signInAt(
      await session.newPage('phone'),
      `/tanks/${waitingRoomReef}/messages`,
      'felix@quayside-dental.test',
    );
    const composer = owner.getByRole('form', { name: 'Write a message' });
    await composer.waitFor();

    await owner.context().setOffline(true);
    await composer.getByLabel('Message', { exact: true }).fill(words);
    await composer.getByRole('button', { name: 'Send' }).click();
    await composer.getByText(/No connection\. Your message is kept here/).waitFor();
    expect(await composer.getByLabel('Message', { exact: true }).inputValue()).toBe(words);

    await owner.context().setOffline(false);
    await owner.getByRole('log').getByText(words).waitFor({ timeout: 30_000 });
    expect(await composer.getByLabel('Message', { exact: true }).inputValue()).toBe('');

    // Stored once, however the retry went.
    const page = await apiInPage<MessagePage>(
      owner,
      'GET',
      `/tanks/${waitingRoomReef}/conversation/messages`,
    );
    expect(page.messages.filter((m) => m.body === words)).toHaveLength(1);
  });
});
