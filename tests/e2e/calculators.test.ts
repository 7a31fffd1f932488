import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { axeViolations, openBrowser, screenshot, type BrowserSession } from '../helpers/browser';

/** Each calculator is a section named by its heading; fields are found by their labels inside it. */
async function openCalculator(session: BrowserSession, id: string, viewport: 'phone' | 'desktop' = 'phone') {
  const page = await session.newPage(viewport);
  await page.goto('/calculators');
  const card = page.locator(`section#${id}`);
  await card.waitFor();
  return { page, card };
}

const field = (card: Locator, name: string) => card.getByRole('textbox', { name });
const shown = (page: Page, testId: string) => page.getByTestId(testId).textContent();
const shownNumber = async (page: Page, testId: string) =>
  Number((await shown(page, testId))?.replace(/,/g, ''));

describe('calculators page', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
  });
  afterAll(() => session.close());

  for (const viewport of ['phone', 'desktop'] as const) {
    it(`opens without signing in, links to every calculator and passes axe on a ${viewport}`, async () => {
      const page = await session.newPage(viewport);
      await page.goto('/calculators');

      await page.getByRole('heading', { level: 1, name: 'Water calculators' }).waitFor();
      const contents = page.getByRole('navigation', { name: 'On this page' }).getByRole('link');
      expect(await contents.allTextContents()).toEqual([
        'Salinity',
        'Toxic ammonia',
        'Alkalinity units',
        'Dosing',
        'Water change planner',
      ]);
      for (const link of await contents.all()) {
        const target = (await link.getAttribute('href'))?.slice(1) ?? '';
        expect(await page.locator(`section#${target} h2`).count()).toBe(1);
      }
      expect(await page.locator('[aria-live="polite"]').count()).toBeGreaterThanOrEqual(5);
      expect(await page.getByText('Where this comes from').count()).toBe(5);
      expect(await axeViolations(page)).toEqual([]);
      await screenshot(page, `calculators-${viewport}`);
    });
  }

  it('fits a 390 px phone in one column with touch targets of at least 44 px', async () => {
    const page = await session.newPage('phone');
    await page.goto('/calculators');
    await page.locator('section#water-change').waitFor();

    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    const smallTargets = await page.evaluate(() =>
      [
        ...document.querySelectorAll(
          'main input:not([type="radio"]), main select, main label:has(> input[type="radio"]), main nav a',
        ),
      ]
        .map((element) => ({ element, box: element.getBoundingClientRect() }))
        .filter(({ box }) => box.height < 44)
        .map(({ element }) => element.outerHTML.slice(0, 80)),
    );

    expect(overflow).toBeLessThanOrEqual(0);
    expect(smallTargets).toEqual([]);
  });

  describe('salinity', () => {
    it('reads standard seawater, 42.914 mS/cm at 15 °C, as salinity 35.00 (PSS-78, Culkin & Smith 1980)', async () => {
      const { page, card } = await openCalculator(session, 'salinity');

      await card.getByRole('radio', { name: 'Conductivity' }).check();
      await field(card, 'Conductivity').fill('42.914');
      await field(card, 'Water temperature').fill('15');

      await expect.poll(() => shown(page, 'salinity-salinity')).toBe('35.00');
      expect(await card.getByText('Culkin & Smith', { exact: false }).count()).toBe(1);
    });

    it('gives 42.91 mS/cm at 15 °C for salinity 35, within the 0.004 the ITS-90 thermometer scale adds', async () => {
      const { page, card } = await openCalculator(session, 'salinity');

      await field(card, 'Practical salinity').fill('35');
      await field(card, 'Water temperature').fill('15');

      // 42.914 is defined at 15 °C on the 1968 scale; 15 °C on today's ITS-90 is 15.0036 °C there.
      await expect
        .poll(async () => Math.abs((await shownNumber(page, 'salinity-conductivity-sample')) - 42.914))
        .toBeLessThanOrEqual(0.01);
      expect(await card.getByText('Conductivity at 15 °C').count()).toBe(1);
    });

    it('reads SG 1.026 at 25 °C as salinity 34.51 against a 25 °C reference and 38.48 against 4 °C (EOS-80)', async () => {
      const { page, card } = await openCalculator(session, 'salinity');

      await card.getByRole('radio', { name: 'Specific gravity' }).check();
      await field(card, 'Specific gravity').fill('1.026');
      await field(card, 'Water temperature').fill('25');
      await card.getByRole('radio', { name: '25 °C (77 °F)', exact: true }).check();
      await expect.poll(() => shown(page, 'salinity-salinity')).toBe('34.51');

      await card.getByRole('radio', { name: '4 °C (39.2 °F)', exact: true }).check();
      await expect.poll(() => shown(page, 'salinity-salinity')).toBe('38.48');
      expect(await shown(page, 'salinity-gravity')).toBe('1.0260');
      expect(await card.getByText('Millero & Poisson', { exact: false }).count()).toBe(1);
    });

    it('shows salinity 35 at 25 °C as SG 1.0264 (25/25), 53.07 mS/cm and 1023.34 kg/m³, also when read in °F', async () => {
      const { page, card } = await openCalculator(session, 'salinity');

      await field(card, 'Practical salinity').fill('35');
      await field(card, 'Water temperature').fill('25');
      await expect.poll(() => shown(page, 'salinity-gravity')).toBe('1.0264');
      expect(await shown(page, 'salinity-conductivity-25')).toBe('53.07');
      expect(await shown(page, 'salinity-density')).toBe('1,023.34');

      await card.getByRole('radio', { name: '°F', exact: true }).check();

      expect(await field(card, 'Water temperature').inputValue()).toBe('77');
      await expect.poll(() => card.getByText('Density at 77 °F').count()).toBe(1);
      expect(await shown(page, 'salinity-density')).toBe('1,023.34');
    });

    it('explains in plain words, tied to the field, a specific gravity no salinity can give', async () => {
      const { page, card } = await openCalculator(session, 'salinity');

      await card.getByRole('radio', { name: 'Specific gravity' }).check();
      const gravity = field(card, 'Specific gravity');
      await gravity.fill('1.2');

      await expect.poll(() => gravity.getAttribute('aria-invalid')).toBe('true');
      const describedBy = (await gravity.getAttribute('aria-describedby'))?.split(' ') ?? [];
      const messages = await Promise.all(describedBy.map((id) => page.locator(`[id="${id}"]`).textContent()));
      expect(messages.join(' ')).toContain('Specific gravity must be between 1 and 1.03169');
      expect(await card.getByText('Check the entries marked above.').count()).toBe(1);
    });

    it('asks for a number, in words, when the entry is not one', async () => {
      const { card } = await openCalculator(session, 'salinity');

      await field(card, 'Water temperature').fill('warm');

      await expect.poll(() => card.getByText('Enter a number, such as 7.5.').count()).toBe(1);
    });
  });

  describe('alkalinity units', () => {
    it('gives 1 meq/L as 2.80 dKH and 50.04 mg/L as CaCO3 (CIAAW 2021 molar masses)', async () => {
      const { page, card } = await openCalculator(session, 'alkalinity');

      await card.getByRole('radio', { name: 'meq/L' }).check();
      await field(card, 'Alkalinity').fill('1');

      await expect.poll(() => shown(page, 'alkalinity-dkh')).toBe('2.80');
      expect(await shown(page, 'alkalinity-caco3')).toBe('50.04');
      expect(await card.getByText('Standard Methods', { exact: false }).count()).toBe(1);
    });

    it('accepts a decimal comma: 2,8 dKH is 0.999 meq/L', async () => {
      const { page, card } = await openCalculator(session, 'alkalinity');

      await field(card, 'Alkalinity').fill('2,8');

      await expect.poll(() => shown(page, 'alkalinity-meq')).toBe('0.999');
    });
  });

  describe('toxic ammonia', () => {
    it('gives 3.81 % un-ionised at 20 °C and pH 8.0 in fresh water (Emerson et al. 1975 table, UF/IFAS FA16)', async () => {
      const { page, card } = await openCalculator(session, 'ammonia');

      await field(card, 'Total ammonia').fill('1');
      await field(card, 'pH').fill('8.0');
      await field(card, 'Water temperature').fill('20');
      await field(card, 'Salinity').fill('0');

      await expect.poll(() => shown(page, 'ammonia-percent')).toBe('3.81');
      expect(await shown(page, 'ammonia-nh3')).toBe('0.0381');
      expect(await card.getByText('Emerson, Russo, Lund & Thurston (1975)', { exact: false }).count()).toBe(
        1,
      );
    });

    it('gives about 5.4 % at 25 °C and pH 8.0, so 1 mg/L total is harmful (common-practice level)', async () => {
      const { page, card } = await openCalculator(session, 'ammonia');

      await field(card, 'Total ammonia').fill('1');
      await field(card, 'pH').fill('8.0');
      await field(card, 'Water temperature').fill('25');
      await field(card, 'Salinity').fill('0');

      await expect.poll(() => shownNumber(page, 'ammonia-percent')).toBeCloseTo(5.4, 1);
      expect(await shown(page, 'ammonia-danger')).toBe('Harmful — act now');
      expect(await card.getByText('a general guide, not a published limit', { exact: false }).count()).toBe(
        1,
      );
    });

    it('gives 8.26 % at 25 °C, salinity 35 and total-scale pH 8.2 (Clegg & Whitfield 1995)', async () => {
      const { page, card } = await openCalculator(session, 'ammonia');

      await field(card, 'Total ammonia').fill('0.5');
      await field(card, 'pH').fill('8.2');
      await field(card, 'Water temperature').fill('25');
      await field(card, 'Salinity').fill('35');

      await expect.poll(() => shown(page, 'ammonia-percent')).toBe('8.26');
      expect(await shown(page, 'ammonia-nh3')).toBe('0.0413');
      expect(await shown(page, 'ammonia-danger')).toBe('Watch closely');
      expect(await card.getByText('total scale', { exact: false }).count()).toBeGreaterThanOrEqual(1);
    });

    it('says low below 0.02 mg/L NH3', async () => {
      const { page, card } = await openCalculator(session, 'ammonia');

      await field(card, 'Total ammonia').fill('0.1');
      await field(card, 'pH').fill('7.8');
      await field(card, 'Salinity').fill('0');

      await expect.poll(() => shown(page, 'ammonia-danger')).toBe('Low');
    });

    it('names the fresh-water range in the person’s own unit when the temperature is outside it', async () => {
      const { card } = await openCalculator(session, 'ammonia');

      await field(card, 'Salinity').fill('0');
      await card.getByRole('radio', { name: '°F', exact: true }).check();
      await field(card, 'Water temperature').fill('130');

      await expect
        .poll(() =>
          card.getByText('Water temperature must be between 32 and 122 °F.', { exact: true }).count(),
        )
        .toBe(1);
    });
  });

  describe('dosing', () => {
    it('gives 3.00 g of sodium bicarbonate to raise 100 L by 1 dKH, with the chemicals caution', async () => {
      const { page, card } = await openCalculator(session, 'dosing');

      await card.getByLabel('Compound').selectOption('sodium bicarbonate');
      await field(card, 'Display tank volume').fill('80');
      await field(card, 'Sump volume').fill('20');
      await field(card, 'Rise in alkalinity wanted').fill('1');

      await expect.poll(() => shown(page, 'dosing-grams')).toBe('3.00');
      expect(await shown(page, 'dosing-litres')).toBe('100.0');
      expect(await page.getByTestId('dosing-split').count()).toBe(0);
      expect(await card.getByText('Wear gloves and eye protection.').isVisible()).toBe(true);
      expect(await card.getByText('Never mix concentrates with each other.').isVisible()).toBe(true);
      expect(await card.getByText('IUPAC/CIAAW 2021', { exact: false }).count()).toBe(1);
    });

    it('converts US gallons through NIST SP 811: 25 US gal +1 dKH is 2.84 g', async () => {
      const { page, card } = await openCalculator(session, 'dosing');

      await card.getByRole('radio', { name: 'US gallons' }).check();
      await field(card, 'Display tank volume').fill('25');
      await field(card, 'Sump volume').fill('');
      await field(card, 'Rise in alkalinity wanted').fill('1');

      await expect.poll(() => shown(page, 'dosing-grams')).toBe('2.84');
      expect(await shown(page, 'dosing-litres')).toBe('94.6');
    });

    it('suggests splitting a rise larger than the common-practice daily step over days', async () => {
      const { page, card } = await openCalculator(session, 'dosing');

      await card.getByLabel('Compound').selectOption('calcium chloride dihydrate');
      await field(card, 'Display tank volume').fill('100');
      await field(card, 'Rise in calcium wanted').fill('50');

      // 100 L × 50 mg/L × 147.01/40.078 = 18.34 g, over three days of at most 20 mg/L.
      await expect.poll(() => shown(page, 'dosing-grams')).toBe('18.3');
      expect(await shown(page, 'dosing-split')).toContain('Split this over 3 days: about 6.11 g a day');
    });
  });

  describe('water change planner', () => {
    it('takes 40 to 20.48 in three 20 % changes with 0 in the new water, listing each step', async () => {
      const { page, card } = await openCalculator(session, 'water-change');

      await field(card, 'Current reading').fill('40');
      await field(card, 'Target').fill('20.48');
      await field(card, 'New water’s reading').fill('0');
      await field(card, 'Change size').fill('20');

      await expect.poll(() => shown(page, 'water-change-count')).toBe('3');
      const rows = card.getByRole('table', { name: 'Reading after each change' }).getByRole('row');
      expect(await rows.allInnerTexts()).toEqual([
        'Change\tReading after',
        '1\t32.00',
        '2\t25.60',
        '3\t20.48',
      ]);
      expect(await shown(page, 'water-change-single')).toContain(
        'One change of 48.8 % would reach the target at once',
      );
    });

    it('says plainly when the target lies beyond the new water’s reading', async () => {
      const { card } = await openCalculator(session, 'water-change');

      await field(card, 'Current reading').fill('40');
      await field(card, 'Target').fill('50');
      await field(card, 'New water’s reading').fill('0');

      await expect
        .poll(() => card.getByText('Water changes can’t reach 50', { exact: false }).count())
        .toBe(1);
      expect(await card.getByRole('table').count()).toBe(0);
    });

    it('says a target equal to the new water’s reading is only approached', async () => {
      const { card } = await openCalculator(session, 'water-change');

      await field(card, 'Target').fill('0');
      await field(card, 'New water’s reading').fill('0');

      await expect.poll(() => card.getByText('never reach it exactly', { exact: false }).count()).toBe(1);
    });
  });
});
