// Debian's Chromium driven by playwright-core for the report's tests. No browser is downloaded: a
// missing Chromium makes the tests fail with a message saying how to install it.
import { existsSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";

export const CHROMIUM = process.env.OUTFIT_CHROMIUM ?? "/usr/bin/chromium";

const ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

export interface Browser {
  context: BrowserContext;
  close(): Promise<void>;
}

/** Launches Chromium with an empty temporary profile; throws a clear error when it is missing. */
export async function launchBrowser(): Promise<Browser> {
  if (!existsSync(CHROMIUM)) {
    throw new Error(
      `Chromium not found at ${CHROMIUM}: the report's browser tests need Debian's chromium. ` +
        "Install it with .ci/setup-browser (apt-get install -y chromium) or set OUTFIT_CHROMIUM to its path.",
    );
  }
  const profile = mkdtempSync(join(tmpdir(), "outfit-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    args: ARGS,
    viewport: { width: 1000, height: 1300 },
    offline: true,
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export interface Watched {
  page: Page;
  /** Console errors and uncaught page errors. */
  errors: string[];
  /** Every request other than the document itself. */
  requests: string[];
  /** Dialogs opened (alert, confirm, prompt). */
  dialogs: string[];
}

/** Opens a file in a new page, recording console errors, requests and dialogs. */
export async function openFile(browser: Browser, file: string): Promise<Watched> {
  const page = await browser.context.newPage();
  const url = `file://${file}`;
  const watched: Watched = { page, errors: [], requests: [], dialogs: [] };
  page.on("console", (message) => {
    if (message.type() === "error") watched.errors.push(message.text());
  });
  page.on("pageerror", (error) => watched.errors.push(error.message));
  page.on("request", (request) => {
    if (request.url() !== url) watched.requests.push(request.url());
  });
  page.on("dialog", (dialog) => {
    watched.dialogs.push(dialog.message());
    void dialog.dismiss();
  });
  await page.goto(url, { waitUntil: "load" });
  return watched;
}

export interface Lazy<T> {
  /** Starts the preparation on first call; every later call gets the same promise. */
  get(): Promise<T>;
  /** The prepared value if the preparation was started and succeeded (for clean-up). */
  settled(): Promise<T | undefined>;
}

/**
 * A preparation shared by the tests of a file and awaited by each of them, so that a missing
 * browser fails every test with its message (a failing `beforeAll` would report them as skipped).
 */
export function lazy<T>(prepare: () => Promise<T>): Lazy<T> {
  let started: Promise<T> | undefined;
  return {
    get: () => (started ??= prepare()),
    settled: async () => (started ? started.catch(() => undefined) : undefined),
  };
}
