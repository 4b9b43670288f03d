/**
 * Browser end-to-end helpers: the real renderer (dist/renderer) in Debian's Chromium, driven by
 * playwright-core, talking to the real main/services through the loopback harness. Nothing is
 * mocked; only the transport differs from the desktop app.
 */
import { existsSync } from 'node:fs';
import { mkdir, mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Page } from 'playwright-core';
import type { AxeResults, RunOptions } from 'axe-core';
import { startHarness } from '../../main/harness/server';

export const repoRoot = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const screenshotDir = join(repoRoot, 'tests', 'artifacts', 'screenshots');
const chromiumPath = '/usr/bin/chromium';

/** Flags from STACK.md "Chromium for browser tests": no sandbox (containers), nothing reaching the network. */
const chromiumArgs = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export interface AppSession {
  readonly page: Page;
  readonly url: string;
  readonly userDataDir: string;
  /** Console errors and CSP violations seen so far; a healthy page has none. */
  readonly pageErrors: string[];
  close(): Promise<void>;
}

export interface OpenAppOptions {
  colorScheme?: 'light' | 'dark';
  /** Harness user-data folder (recovery copy, recent files); a fresh temp dir when absent. */
  userDataDir?: string;
  /** Wait for a course to be open (the demo on a fresh start). Default true. */
  waitForCourse?: boolean;
}

export async function openApp(opts: OpenAppOptions = {}): Promise<AppSession> {
  if (!existsSync(join(repoRoot, 'dist', 'renderer', 'index.html'))) {
    throw new Error('dist/renderer/index.html is missing: run "npm run build:renderer" before the browser tests.');
  }
  if (!existsSync(chromiumPath)) {
    throw new Error(`${chromiumPath} is missing: install Debian's Chromium ("apt-get install -y chromium").`);
  }
  const temp = await mkdtemp(join(tmpdir(), 'weighbridge-e2e-'));
  const userDataDir = opts.userDataDir ?? join(temp, 'user-data');
  await mkdir(userDataDir, { recursive: true });
  const harness = await startHarness({ userDataDir });
  const context = await chromium
    .launchPersistentContext(join(temp, 'profile'), {
      executablePath: chromiumPath,
      headless: true,
      args: chromiumArgs,
      colorScheme: opts.colorScheme ?? 'light',
      viewport: { width: 1280, height: 820 },
      env: { ...process.env, XDG_CONFIG_HOME: join(temp, 'xdg-config'), XDG_CACHE_HOME: join(temp, 'xdg-cache') },
    })
    .catch(async (error: unknown) => {
      await harness.close();
      throw error;
    });
  const page = context.pages()[0] ?? (await context.newPage());
  const pageErrors: string[] = [];
  page.on('console', (msg) => {
    if (msg.type() === 'error') pageErrors.push(msg.text());
  });
  page.on('pageerror', (error) => pageErrors.push(error.message));
  const close = async () => {
    await context.close().catch(() => undefined);
    await harness.close().catch(() => undefined);
    await rm(temp, { recursive: true, force: true }).catch(() => undefined);
  };
  try {
    await page.goto(harness.url);
    if (opts.waitForCourse !== false) await waitForCourse(page);
  } catch (error) {
    await close();
    throw error;
  }
  return { page, url: harness.url, userDataDir, pageErrors, close };
}

/** Resolves once the frame shows an open course. */
export async function waitForCourse(page: Page): Promise<void> {
  await page.locator('[data-app-state="ready"]').waitFor({ timeout: 20_000 });
}

let axeSource: string | null = null;

/**
 * Runs axe-core in the page. The source is evaluated through the DevTools protocol
 * (page.evaluate), which the page's CSP does not govern — a <script> tag would be refused by
 * script-src 'self', and loosening the CSP for tests would hide real violations.
 */
export async function runAxe(page: Page, options?: RunOptions): Promise<AxeResults> {
  axeSource ??= await readFile(join(repoRoot, 'node_modules', 'axe-core', 'axe.min.js'), 'utf8');
  const loaded = await page.evaluate(() => 'axe' in window);
  if (!loaded) await page.evaluate(axeSource);
  const runOptions: RunOptions = options ?? {
    runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'] },
  };
  return page.evaluate(
    (o) => (window as unknown as { axe: { run(context: Document, options: unknown): Promise<AxeResults> } }).axe.run(document, o),
    runOptions as unknown as Record<string, unknown>,
  );
}

/** One line per violation and node, for a readable assertion failure. */
export function describeViolations(results: AxeResults): string[] {
  return results.violations.flatMap((v) => v.nodes.map((n) => `${v.id} (${v.impact ?? 'n/a'}): ${v.help} — ${n.target.join(' ')} — ${n.failureSummary ?? ''}`));
}

/**
 * Writes tests/artifacts/screenshots/<name>.png. The frame scrolls inside its workspace area, so
 * the window is made tall enough for the whole workspace first (at most 4000 px), then restored.
 */
export async function screenshot(page: Page, name: string): Promise<string> {
  await mkdir(screenshotDir, { recursive: true });
  const path = join(screenshotDir, `${name}.png`);
  const viewport = page.viewportSize();
  const needed = await page.evaluate(() => {
    const main = document.querySelector('main');
    return main === null ? 0 : window.innerHeight - main.clientHeight + main.scrollHeight;
  });
  if (viewport !== null && needed > viewport.height) await page.setViewportSize({ width: viewport.width, height: Math.min(needed, 4000) });
  await page.screenshot({ path, fullPage: true });
  if (viewport !== null && needed > viewport.height) await page.setViewportSize(viewport);
  return path;
}

/** Types a path into the harness's path dialog (there are no native dialogs in the browser) and confirms it. */
export async function answerPathDialog(page: Page, path: string): Promise<void> {
  const dialog = page.getByRole('dialog');
  const field = dialog.getByLabel('File path');
  await field.fill(path);
  await field.press('Enter');
  await dialog.waitFor({ state: 'detached' });
}
