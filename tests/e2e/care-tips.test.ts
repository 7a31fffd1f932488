import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AudienceCount, CareTip, TipFeedItem } from '@shared/schemas/care-tips';
import { demoId } from '../../api/dev/seed/index';
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
 * A care tip from the composer to the owner's phone: an admin writes it with a caution box, sees
 * the caution in the preview (side by side on a desktop, behind a tab on a phone), picks one of the
 * reef's photos, sends it to the tanks keeping Duncan coral — in the demo only the living room
 * reef — and its owner, on a 390 px phone, is notified, reads it on the tank page with its photo,
 * marks it helpful; the admin sees who it reached, then withdraws it and it leaves the owner's feed.
 */

const livingRoomReef = demoId('ashdown-reef');
const reefCoverPhoto = demoId('photo:ashdown-reef:cover');
const duncan = { kind: 'species', speciesId: 'duncan-coral' } as const;

describe('care tips in the browser', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('goes from the composer to the tanks keeping a species, and back out when withdrawn', async () => {
    const title = `Feeding the Duncan coral ${Date.now().toString(36)}`;
    const admin = await signInAt(await session.newPage('desktop'), '/console/tips', 'mara@driftglass.test');
    await admin.getByRole('heading', { level: 1, name: 'Care tips' }).waitFor();

    // Write it: title, category, a body with a caution box.
    await admin.getByRole('link', { name: 'Write a tip' }).click();
    await admin.waitForURL('**/console/tips/new');
    const composer = admin.getByRole('form', { name: 'Write a care tip' });
    await composer.getByLabel('Title').fill(title);
    await composer.getByRole('radio', { name: 'Livestock', exact: true }).check();
    await composer
      .getByRole('textbox', { name: 'Text', exact: true })
      .fill(
        [
          'A **Duncan coral** grows faster when it is fed twice a week: a pinch of small frozen food on each head, with the pumps off for ten minutes.',
          '',
          '::: caution',
          'Switch the pumps off at the wall and unplug them with dry hands before your hands go in the water.',
          ':::',
        ].join('\n'),
      );

    // The preview beside it renders the caution from the same renderer the owners' feed uses.
    const preview = composer.getByRole('region', { name: 'Preview' });
    const caution = preview.getByRole('note', { name: 'Caution' });
    await caution.waitFor();
    expect(await caution.textContent()).toContain('Switch the pumps off at the wall');
    expect(await preview.locator('strong', { hasText: 'Duncan coral' }).count()).toBe(1);

    // Only the tanks keeping Duncan coral; the live count is the API's.
    await composer.getByRole('radio', { name: /Tanks keeping a species/ }).check();
    await composer.getByRole('searchbox', { name: 'Find the species' }).fill('Duncan');
    await composer.getByRole('radio', { name: /^Duncan coral/ }).check();
    const expected = await apiInPage<AudienceCount>(admin, 'POST', '/care-tips/audience-count', {
      audience: duncan,
    });
    expect(expected.tanks).toBe(1);
    const reach = `Reaches 1 tank and ${expected.owners} owner${expected.owners === 1 ? '' : 's'}`;
    await composer.getByText(reach).waitFor();

    // One of the reef's photos goes with it, chosen from the tank's pictures.
    const photoPart = composer.getByRole('region', { name: 'Photo', exact: true });
    await photoPart.getByRole('combobox', { name: 'Tank' }).selectOption(livingRoomReef);
    await photoPart
      .getByRole('group', { name: 'Photos of Living room reef' })
      .getByRole('radio', { name: 'Living room reef after the last visit' })
      .check();
    await photoPart.getByRole('button', { name: 'Remove photo' }).waitFor();
    await expectAxeClean(admin, 'the composer at 1280 px');
    await expectNoSidewaysScroll(admin, 'the composer at 1280 px');
    await screenshot(admin, 'care-tip-composer-desktop');
    await photoPart.screenshot({ path: `${artifactsDir}/care-tip-composer-photo-desktop.png` });

    // On a phone the preview sits behind its own tab.
    await admin.setViewportSize(viewports.phone);
    await composer.getByRole('radio', { name: 'Preview', exact: true }).check();
    await caution.waitFor();
    expect(await composer.getByRole('textbox', { name: 'Text', exact: true }).isVisible()).toBe(false);
    await expectAxeClean(admin, 'the composer at 390 px');
    await expectNoSidewaysScroll(admin, 'the composer at 390 px');
    await screenshot(admin, 'care-tip-composer-phone');
    await photoPart.screenshot({ path: `${artifactsDir}/care-tip-composer-photo-phone.png` });
    await composer.getByRole('radio', { name: 'Write', exact: true }).check();
    await admin.setViewportSize(viewports.desktop);

    // Sending saves it first, then sends it now.
    await composer.getByRole('button', { name: 'Send now' }).click();
    await admin.waitForURL(/\/console\/tips\/[0-9a-f-]{36}$/);
    const tipId = new URL(admin.url()).pathname.split('/').at(-1)!;
    await admin.getByText('Sent. The owners of the tanks it reaches are told.').waitFor();
    const sent = await apiInPage<CareTip>(admin, 'GET', `/care-tips/${tipId}`);
    expect(sent).toMatchObject({
      title,
      status: 'sent',
      category: 'livestock',
      audience: duncan,
      photoId: reefCoverPhoto,
    });
    expect(sent.reached.tanks).toBe(1);

    // The list shows it sent, with how far it went.
    await admin.goto('/console/tips');
    const row = admin.getByRole('listitem').filter({ has: admin.getByRole('link', { name: title }) });
    await row.getByText('Sent', { exact: true }).waitFor();
    await row.getByText(`Reached 1 tank and ${sent.reached.owners} owner`, { exact: false }).waitFor();
    for (const viewport of ['desktop', 'phone'] as const) {
      await admin.setViewportSize(viewports[viewport]);
      await row.waitFor();
      await expectAxeClean(admin, `the tips list at ${viewports[viewport].width} px`);
      await expectNoSidewaysScroll(admin, `the tips list at ${viewports[viewport].width} px`);
      await screenshot(admin, `care-tips-list-${viewport}`);
    }
    await admin.setViewportSize(viewports.desktop);

    // The owner, on a phone, is told and reads it on the tank page, caution and all.
    const owner = await signInAt(
      await session.newPage('phone'),
      `/tanks/${livingRoomReef}`,
      'helen@ashdown-home.test',
    );
    await expect
      .poll(
        async () => {
          const inbox = await apiInPage<{ items: { title: string; link: string }[] }>(
            owner,
            'GET',
            '/notifications',
          );
          return inbox.items.some((n) => n.title === `Care tip: ${title}` && n.link.includes(tipId));
        },
        { timeout: 60_000, interval: 1000 },
      )
      .toBe(true);
    await owner.reload();
    const tips = owner.getByRole('region', { name: 'Care tips' });
    const card = tips.getByRole('article', { name: title });
    await card.waitFor();
    await card.getByRole('note', { name: 'Caution' }).waitFor();
    expect(await card.textContent()).toContain('fed twice a week');
    // Its photo: the thumbnail, loaded, opening the full photo.
    const photo = card.getByRole('img', { name: title, exact: true });
    await photo.scrollIntoViewIfNeeded();
    expect(await photo.getAttribute('src')).toBe(`/api/photos/${reefCoverPhoto}/thumbnail`);
    await expect
      .poll(() => photo.evaluate((img: HTMLImageElement) => (img.complete ? img.naturalWidth : 0)))
      .toBeGreaterThan(0);
    expect(await card.getByRole('link', { name: title }).getAttribute('href')).toBe(
      `/api/photos/${reefCoverPhoto}`,
    );
    await expectAxeClean(owner, "the owner's tank page with the tip");
    await expectNoSidewaysScroll(owner, "the owner's tank page with the tip");
    await card.scrollIntoViewIfNeeded();
    await screenshot(owner, 'care-tip-owner-tank-phone');

    // Helpful, at once and for good.
    const helpful = card.getByRole('button', { name: `Helpful “${title}”` });
    expect(await helpful.getAttribute('aria-pressed')).toBe('false');
    await helpful.click();
    await expect.poll(() => helpful.getAttribute('aria-pressed')).toBe('true');
    await expect
      .poll(async () => {
        const feed = await apiInPage<TipFeedItem[]>(owner, 'GET', `/care-tips/feed?tankId=${livingRoomReef}`);
        return feed.find((item) => item.tipId === tipId)?.helpful;
      })
      .toBe(true);

    // Older tips come a page at a time, after the ones shown.
    const shown = await tips.getByRole('article').count();
    await tips.getByRole('button', { name: 'Show older tips' }).click();
    await expect.poll(() => tips.getByRole('article').count()).toBeGreaterThan(shown);
    expect(await tips.getByRole('article').first().getAttribute('aria-labelledby')).toBe(
      await card.getAttribute('aria-labelledby'),
    );

    // The notification's link opens the tip on the tank's timeline, caution and all.
    const inbox = await apiInPage<{ items: { title: string; link: string }[] }>(
      owner,
      'GET',
      '/notifications',
    );
    const link = inbox.items.find((n) => n.link.includes(tipId))!.link;
    expect(link).toBe(`/tanks/${livingRoomReef}?section=timeline&tip=${tipId}`);
    await owner.goto(link);
    const timeline = owner.getByRole('main');
    await timeline.getByText(title).first().waitFor();
    await timeline.getByRole('note', { name: 'Caution' }).first().waitFor();
    const timelinePhoto = timeline
      .getByRole('article', { name: title })
      .getByRole('img', { name: title, exact: true });
    expect(await timelinePhoto.getAttribute('src')).toBe(`/api/photos/${reefCoverPhoto}/thumbnail`);
    await expectAxeClean(owner, "the tip on the tank's timeline");
    await screenshot(owner, 'care-tip-owner-timeline-phone');

    // The dashboard's feed carries it too, with the tank it came for.
    await owner.goto('/tanks');
    const dashboardTips = owner.getByRole('region', { name: /^Tips from / });
    const dashboardCard = dashboardTips.getByRole('article', { name: title });
    await dashboardCard.waitFor();
    await dashboardCard.getByText('For Living room reef').waitFor();
    expect(
      await dashboardCard.getByRole('button', { name: `Helpful “${title}”` }).getAttribute('aria-pressed'),
    ).toBe('true');
    for (const viewport of ['phone', 'desktop'] as const) {
      await owner.setViewportSize(viewports[viewport]);
      await dashboardCard.waitFor();
      await expectAxeClean(owner, `the owner's dashboard at ${viewports[viewport].width} px`);
      await expectNoSidewaysScroll(owner, `the owner's dashboard at ${viewports[viewport].width} px`);
      await screenshot(owner, `care-tips-owner-feed-${viewport}`);
    }

    // Staff see who it reached and who found it helpful.
    await admin.goto(`/console/tips/${tipId}`);
    const reached = admin.getByRole('region', { name: 'Who it reached' });
    await reached.getByRole('list', { name: 'Tanks' }).getByText('Living room reef').waitFor();
    const helen = reached
      .getByRole('list', { name: 'Owners' })
      .getByRole('listitem')
      .filter({ hasText: 'Helen' });
    await helen.getByText('Found it helpful').waitFor();
    await expectAxeClean(admin, 'the tip with its reach');
    await screenshot(admin, 'care-tip-reach-desktop');

    // Withdrawn from the list: it leaves the owner's feed, and its record stays.
    await admin.goto('/console/tips');
    await row.getByRole('button', { name: `Withdraw “${title}”` }).click();
    const dialog = admin.getByRole('dialog', { name: `Withdraw “${title}”?` });
    await dialog
      .getByText('it disappears from owners’ feeds; what was sent stays recorded', { exact: false })
      .waitFor();
    await expectAxeClean(admin, 'the withdraw question');
    await dialog.getByRole('button', { name: 'Withdraw the tip' }).click();
    await admin.getByRole('status').getByText(`“${title}” is withdrawn.`).waitFor();
    await row.getByText('Withdrawn', { exact: true }).waitFor();
    const withdrawn = await apiInPage<CareTip>(admin, 'GET', `/care-tips/${tipId}`);
    expect(withdrawn.status).toBe('withdrawn');
    expect(withdrawn.reached.tanks).toBe(1);

    const feed = await apiInPage<TipFeedItem[]>(owner, 'GET', `/care-tips/feed?tankId=${livingRoomReef}`);
    expect(feed.map((item) => item.tipId)).not.toContain(tipId);
    await owner.goto(`/tanks/${livingRoomReef}`);
    // The section and its loading state appear together; once loading is over, the feed is shown.
    await tips.waitFor();
    await tips.getByText('Loading care tips…').waitFor({ state: 'detached' });
    expect(await tips.getByRole('article', { name: title }).count()).toBe(0);
  });
});
