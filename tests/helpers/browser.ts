import { mkdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { expect, inject } from 'vitest';
import { demoPassword } from '../../api/dev/demo-people';
import { chromiumPath } from './chromium';

const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');
export const artifactsDir = path.resolve('tests/artifacts');

export const viewports = {
  phone: { width: 390, height: 844 },
  desktop: { width: 1280, height: 900 },
} as const;

export interface BrowserSession {
  browser: Browser;
  baseUrl: string;
  newPage(viewport?: keyof typeof viewports): Promise<Page>;
  close(): Promise<void>;
}

/** Debian's Chromium, headless, with no background traffic (Playwright gives it a new empty profile). */
export async function openBrowser(): Promise<BrowserSession> {
  const browser = await chromium.launch({
    executablePath: chromiumPath,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  const baseUrl = inject('appUrl');
  return {
    browser,
    baseUrl,
    async newPage(viewport = 'desktop') {
      const context = await browser.newContext({ viewport: viewports[viewport], baseURL: baseUrl });
      return context.newPage();
    },
    async close() {
      await browser.close();
    },
  };
}

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[] }[];
}

/** Runs axe-core (WCAG 2.x A/AA rules) in the page and returns what it found. */
export async function axeViolations(page: Page): Promise<AxeViolation[]> {
  // Evaluated over the DevTools protocol, so the page's strict CSP stays on during the check.
  await page.evaluate(axeSource);
  return page.evaluate(async () => {
    // A colour caught halfway through a transition (a button coming back from disabled) is not
    // what anyone reads: let running transitions and animations end first (infinite ones, such as
    // a spinner, are left running).
    await Promise.all(
      document
        .getAnimations()
        .filter((animation) => animation.effect?.getComputedTiming().endTime !== Infinity)
        .map((animation) => animation.finished.catch(() => undefined)),
    );
    const axe = (
      window as unknown as {
        axe: { run: (ctx: Document, opts: object) => Promise<{ violations: AxeViolation[] }> };
      }
    ).axe;
    const result = await axe.run(document, {
      runOnly: {
        type: 'tag',
        values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'],
      },
    });
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.map((n) => ({ target: n.target })),
    }));
  });
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(artifactsDir, { recursive: true });
  const file = path.join(artifactsDir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Opens `path` on a page, signs in as a demo person through the identity provider, and waits to be back. */
export async function signInAt(page: Page, path: string, email: string): Promise<Page> {
  await page.goto(path);
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(demoPassword);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname === path);
  return page;
}

/** Calls the API from inside the signed-in page, as the app does (same cookies, same CSRF header). */
export async function apiInPage<T>(page: Page, method: string, path: string, body?: unknown): Promise<T> {
  return page.evaluate(
    async ({ method, path, body }) => {
      const response = await fetch(`/api${path}`, {
        method,
        headers: {
          Accept: 'application/json',
          'X-Requested-With': 'brinewatch',
          ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
        },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      if (!response.ok) throw new Error(`${method} ${path}: ${response.status} ${await response.text()}`);
      return response.status === 204 ? null : response.json();
    },
    { method, path, body },
  ) as Promise<T>;
}

/** Fails with each axe violation's rule and elements, named by where the page was. */
export async function expectAxeClean(page: Page, where: string) {
  const violations = await axeViolations(page);
  expect(
    violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`),
    `axe on ${where}`,
  ).toEqual([]);
}

/** The page fits its viewport's width: nothing makes a phone scroll sideways. */
export async function expectNoSidewaysScroll(page: Page, where: string) {
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow, `${where} scrolls sideways`).toBeLessThanOrEqual(0);
}

/**
 * A screen at both widths: axe clean, no sideways scroll, a screenshot of each. It ends at `end`'s
 * width, so the test goes on at the width it was using.
 */
export async function checkAtBothWidths(page: Page, name: string, end: keyof typeof viewports = 'phone') {
  const order = end === 'phone' ? (['desktop', 'phone'] as const) : (['phone', 'desktop'] as const);
  for (const viewport of order) {
    await page.setViewportSize(viewports[viewport]);
    await expectAxeClean(page, `${name} at ${viewports[viewport].width} px`);
    await expectNoSidewaysScroll(page, `${name} at ${viewports[viewport].width} px`);
    await screenshot(page, `${name}-${viewport}`);
  }
}
