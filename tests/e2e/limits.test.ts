import type { Locator } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoId } from '../../api/dev/seed/index';
import { axeViolations, openBrowser, screenshot, type BrowserSession, signInAt } from '../helpers/browser';

// Tomás looks after this tank; no other browser test reads its limits.
const saltfigLagoon = demoId('saltfig-lagoon');

/** The text under a field: its hint and, when refused, its message (the field's aria-describedby). */
async function describedBy(field: Locator) {
  const ids = (await field.getAttribute('aria-describedby'))?.split(' ') ?? [];
  const texts = await Promise.all(ids.map((id) => field.page().locator(`[id="${id}"]`).textContent()));
  return texts.join(' ');
}

/** The template's bounds, whether the tank follows the template or keeps a copy of it (beside a rate rule). */
const asTemplate =
  /^(Template default \(common practice\)|This tank's own limits, the same as the template)$/;

describe('the limits editor', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  it('lets a technician change a bound, refuses a crossed one and goes back to the template', async () => {
    const page = await session.newPage('desktop');
    await signInAt(page, `/tanks/${saltfigLagoon}`, 'tomas@driftglass.test');
    // The limits sit with the readings (a section of the tank page, named in the address).
    await page.goto(`/tanks/${saltfigLagoon}?section=readings`);
    await page.getByRole('heading', { name: 'Limits' }).waitFor();
    const editor = () => page.getByRole('region', { name: 'Limits' });
    const row = () => page.getByTestId('limits-temperature');
    const warnHigh = () => row().getByLabel('Warning above', { exact: true });
    const critHigh = () => row().getByLabel('Critical above', { exact: true });
    await row().getByText(asTemplate).waitFor();
    const templateWarnHigh = Number(await warnHigh().inputValue());
    const templateCritHigh = Number(await critHigh().inputValue());
    expect(templateCritHigh).toBeGreaterThan(templateWarnHigh);

    // A bound between the template's warning and critical ones.
    const edited = (templateWarnHigh + templateCritHigh) / 2;
    await warnHigh().fill(String(edited));
    await row().getByText('Changed, not saved yet').waitFor();
    await editor().getByRole('button', { name: 'Save 1 change' }).click();
    await page.getByRole('status').getByText('Limits saved.').waitFor();
    await row().getByText("This tank's own limits").waitFor();

    await page.reload();
    await row().getByText("This tank's own limits").waitFor();
    expect(Number(await warnHigh().inputValue())).toBe(edited);
    expect(await axeViolations(page)).toEqual([]);

    // A critical bound below the warning one is refused under its own field, and nothing is saved.
    await critHigh().fill(String(edited - 1));
    await expect.poll(() => critHigh().getAttribute('aria-invalid')).toBe('true');
    expect(await describedBy(critHigh())).toContain('Warning above');
    await page.getByText('Fix the marked limits first.').waitFor();
    expect(await editor().getByRole('button', { name: /^Save/ }).isDisabled()).toBe(true);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'limits-refused-desktop');

    // Back to the template: the crossed bound goes with the tank's own values.
    await row().getByRole('button', { name: 'Use template for Temperature' }).click();
    await row().getByText('Back to the template when saved').waitFor();
    expect(Number(await warnHigh().inputValue())).toBe(templateWarnHigh);
    expect(Number(await critHigh().inputValue())).toBe(templateCritHigh);
    expect(await critHigh().getAttribute('aria-invalid')).toBeNull();
    await editor().getByRole('button', { name: 'Save 1 change' }).click();
    await page.getByRole('status').getByText('Limits saved.').waitFor();

    await page.reload();
    await row().getByText(asTemplate).waitFor();
    expect(Number(await warnHigh().inputValue())).toBe(templateWarnHigh);
    expect(await axeViolations(page)).toEqual([]);
  });
});
