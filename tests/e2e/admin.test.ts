import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { demoPassword } from '../../api/dev/demo-people';
import { axeViolations, openBrowser, screenshot, viewports, type BrowserSession } from '../helpers/browser';

interface Mail {
  to: string[];
  subject: string;
  text: string;
}

/** The mail stand-in keeps every message; wait for the first one to this address. */
async function mailTo(address: string): Promise<Mail> {
  const mailboxUrl = inject('mailboxUrl');
  for (let attempt = 0; attempt < 50; attempt += 1) {
    const messages = (await (await fetch(`${mailboxUrl}/api/messages`)).json()) as Mail[];
    const found = messages.find((mail) => mail.to.includes(address));
    if (found) return found;
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error(`no e-mail reached ${address}`);
}

/** axe at both widths on the same signed-in page, then a full-page picture at each. */
async function checkAtBothWidths(page: Page, name: string) {
  for (const viewport of ['phone', 'desktop'] as const) {
    await page.setViewportSize(viewports[viewport]);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, `${name}-${viewport}`);
  }
}

// The e2e database is shared by every browser test file in a run: each change made here is undone here.
describe('the admin screens', () => {
  let session: BrowserSession;
  let page: Page;
  const invitee = 'new.technician@driftglass.test';
  const clientInvitee = 'second.owner@ashdown-home.test';
  let invitationLink = '';

  beforeAll(async () => {
    session = await openBrowser();
    page = await session.newPage('desktop');
    await page.goto('/console/staff');
    await page.getByLabel('Email').fill('mara@driftglass.test');
    await page.getByLabel('Password').fill(demoPassword);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/console\/staff$/);
  });
  afterAll(() => session.close());

  it('lists the team with roles and status, and marks the signed-in admin', async () => {
    const team = page.getByRole('region', { name: 'Team' });
    await team.getByRole('heading', { name: 'Priya Raman' }).waitFor();
    expect(await team.getByRole('heading', { level: 3 }).allTextContents()).toEqual([
      'Mara Okonkwo-Hale (you)',
      'Priya Raman',
      'Tomas Lindqvist',
    ]);
    expect(await team.getByRole('button', { name: 'Make admin Priya Raman' }).isVisible()).toBe(true);
    expect(await team.getByRole('button', { name: /Mara Okonkwo-Hale/ }).count()).toBe(0);
  });

  it('shows what is wrong beside the field before sending an invitation', async () => {
    const form = page.getByRole('region', { name: 'Invite a staff member' });
    await form.getByLabel('E-mail address').fill('not an address');
    await form.getByRole('button', { name: 'Send invitation' }).click();

    await form.getByText('Enter a valid e-mail address.').waitFor();
    const field = form.getByLabel('E-mail address');
    expect(await field.getAttribute('aria-invalid')).toBe('true');
    // The message can show as the field is left; focus moves when the submit's own check ends.
    await expect.poll(() => field.evaluate((input) => input === document.activeElement)).toBe(true);
  });

  it('invites a technician, lists the invitation as waiting and e-mails a single-use link', async () => {
    const form = page.getByRole('region', { name: 'Invite a staff member' });
    await form.getByLabel('E-mail address').fill(invitee);
    await form.getByLabel('Name (optional)').fill('Jonah Reyes');
    await form.getByRole('radio', { name: /^Technician/ }).check();
    await form.getByRole('button', { name: 'Send invitation' }).click();

    await form.getByText(`Invitation sent to ${invitee}.`).waitFor();
    const waiting = page.getByRole('list', { name: 'Waiting to be accepted' });
    const row = waiting.getByRole('listitem').filter({ hasText: invitee });
    await row.waitFor();
    expect(await row.textContent()).toContain('Technician');
    expect(await row.textContent()).toContain('Waiting');

    const mail = await mailTo(invitee);
    expect(mail.subject).toBe('Your Brinewatch invitation from Driftglass Aquatic Care');
    expect(mail.text).toContain('Hello Jonah Reyes,');
    invitationLink = /https?:\/\/\S+\/auth\/invitation\/[\w-]+/.exec(mail.text)?.[0] ?? '';
    expect(invitationLink).not.toBe('');

    // The stand-in identity provider knows only the demo people, so the link is followed as far
    // as the sign-in form; accepting it is covered by the API tests.
    const stranger = await session.newPage('phone');
    await stranger.goto(invitationLink);
    await stranger.getByRole('heading', { name: 'Sign in' }).waitFor();
    await stranger.context().close();
  });

  it('passes axe on the staff screen at phone and desktop widths', async () => {
    await page.getByRole('list', { name: 'Waiting to be accepted' }).waitFor();
    await checkAtBothWidths(page, 'admin-staff');
  });

  it("changes a technician's role to admin and back", async () => {
    const team = page.getByRole('region', { name: 'Team' });
    const priya = team.getByRole('listitem').filter({ hasText: 'Priya Raman' });

    await priya.getByRole('button', { name: 'Make admin Priya Raman' }).click();
    await team.getByText('Priya Raman is now an admin.').waitFor();
    expect(await priya.textContent()).toContain('Admin');

    await priya.getByRole('button', { name: 'Make technician Priya Raman' }).click();
    await team.getByText('Priya Raman is now a technician.').waitFor();
    expect(await priya.textContent()).toContain('Technician');
    await priya.getByRole('button', { name: 'Make admin Priya Raman' }).waitFor();
  });

  it('revokes the invitation, after which its link no longer works', async () => {
    const row = page
      .getByRole('list', { name: 'Waiting to be accepted' })
      .getByRole('listitem')
      .filter({ hasText: invitee });
    await row.getByRole('button', { name: `Revoke the invitation for ${invitee}` }).click();
    const dialog = page.getByRole('dialog', { name: 'Revoke this invitation?' });
    await dialog.waitFor();
    await dialog.getByRole('button', { name: 'Revoke', exact: true }).click();
    await page.getByText(`The invitation for ${invitee} is revoked.`).waitFor();
    expect(await dialog.isVisible()).toBe(false);

    const stranger = await session.newPage('phone');
    await stranger.goto(invitationLink);
    await stranger.getByRole('heading', { name: 'This invitation link no longer works' }).waitFor();
    await stranger.context().close();
  });

  it('lists clients with their tanks and finds them by tank name', async () => {
    await page.getByRole('link', { name: 'Clients' }).click();
    await page.waitForURL(/\/console\/clients$/);
    const clients = page.getByRole('region', { name: 'All clients' });
    const helen = clients
      .getByRole('listitem')
      .filter({ has: page.getByRole('heading', { name: 'Helen Ashdown' }) });
    await helen.waitFor();
    expect(await helen.getByRole('list', { name: 'Tanks Helen Ashdown follows' }).textContent()).toContain(
      "Kids' river tank",
    );

    await clients.getByRole('searchbox', { name: 'Search clients' }).fill('lagoon');
    await clients.getByText('1 of 4 clients match.').waitFor();
    expect(await clients.getByRole('heading', { level: 3 }).allTextContents()).toEqual(['Rosa Delgado']);

    await clients.getByRole('searchbox', { name: 'Search clients' }).fill('');
    await clients.getByRole('heading', { name: 'Sam Whitlock' }).waitFor();
  });

  it('asks before deactivating a client, says their sessions end, and reactivates them', async () => {
    const clients = page.getByRole('region', { name: 'All clients' });
    const sam = clients
      .getByRole('listitem')
      .filter({ has: page.getByRole('heading', { name: 'Sam Whitlock' }) });

    await sam.getByRole('button', { name: 'Deactivate Sam Whitlock' }).click();
    const dialog = page.getByRole('dialog', { name: 'Deactivate Sam Whitlock?' });
    await dialog.waitFor();
    expect(await dialog.textContent()).toContain('All of their sessions end at once');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Cancel');
    expect(await axeViolations(page)).toEqual([]);
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'hidden' });
    expect(await sam.textContent()).toContain('Active');

    await sam.getByRole('button', { name: 'Deactivate Sam Whitlock' }).click();
    await dialog.getByRole('button', { name: 'Deactivate', exact: true }).click();
    await clients.getByText('Sam Whitlock is deactivated and signed out everywhere.').waitFor();
    expect(await sam.textContent()).toContain('Deactivated');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Reactivate Sam Whitlock');

    await sam.getByRole('button', { name: 'Reactivate Sam Whitlock' }).click();
    await clients.getByText('Sam Whitlock is active again and can sign in.').waitFor();
    await sam.getByRole('button', { name: 'Deactivate Sam Whitlock' }).waitFor();
    expect(await sam.textContent()).toContain('Active');
  });

  it('asks for a tank, then invites a client to it and lists the invitation', async () => {
    const form = page.getByRole('region', { name: 'Invite a client' });
    const tank = form.getByRole('combobox', { name: 'Tank' });
    await expect.poll(() => tank.isEnabled()).toBe(true);
    await form.getByLabel('E-mail address').fill(clientInvitee);
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await form.getByText('Choose a tank.').waitFor();
    await expect.poll(() => tank.evaluate((select) => select === document.activeElement)).toBe(true);

    await tank.selectOption({ label: "Kids' river tank — Ashdown family home — playroom" });
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await form.getByText(`Invitation sent to ${clientInvitee}.`).waitFor();
    const row = page
      .getByRole('region', { name: 'Client invitations' })
      .getByRole('listitem')
      .filter({ hasText: clientInvitee });
    expect(await row.textContent()).toContain("Tank: Kids' river tank");
    expect((await mailTo(clientInvitee)).text).toContain('follow your tank "Kids\' river tank"');
  });

  it('passes axe on the clients screen at phone and desktop widths', async () => {
    await checkAtBothWidths(page, 'admin-clients');
  });

  it('revokes the client invitation', async () => {
    const invitations = page.getByRole('region', { name: 'Client invitations' });
    await invitations.getByRole('button', { name: `Revoke the invitation for ${clientInvitee}` }).click();
    await page
      .getByRole('dialog', { name: 'Revoke this invitation?' })
      .getByRole('button', { name: 'Revoke', exact: true })
      .click();
    await invitations.getByText(`The invitation for ${clientInvitee} is revoked.`).waitFor();
    expect(await invitations.getByRole('list', { name: 'Waiting to be accepted' }).count()).toBe(0);
  });

  it('shows technicians the client list without the admin actions', async () => {
    const technician = await session.newPage('phone');
    await technician.goto('/console/clients');
    await technician.getByLabel('Email').fill('tomas@driftglass.test');
    await technician.getByLabel('Password').fill(demoPassword);
    await technician.getByRole('button', { name: 'Sign in' }).click();
    await technician.getByRole('heading', { name: 'Helen Ashdown' }).waitFor();

    expect(await technician.getByRole('button', { name: /^Deactivate/ }).count()).toBe(0);
    expect(await technician.getByRole('region', { name: 'Invite a client' }).count()).toBe(0);
    expect(await axeViolations(technician)).toEqual([]);
    await technician.context().close();
  });
});
