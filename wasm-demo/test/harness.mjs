// Shared set-up of the section tests: Debian's Chromium, headless, offline,
// the built file over file://, every request logged (only file:// allowed).
import assert from 'node:assert/strict';
import { execSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';

const here = dirname(fileURLToPath(import.meta.url));
export const html = join(here, '..', 'dist', 'echoline.html');
export const url = pathToFileURL(html).href;
export const artifacts = join(here, 'artifacts');
mkdirSync(artifacts, { recursive: true });

export const C0 = 299_792_458; // m/s, exact (SI definition of the metre)
export const FT = 0.3048; // m per international foot, exact

export const close = (got, want, rtol, what, atol = 0) =>
  assert.ok(Math.abs(got - want) <= rtol * Math.abs(want) + atol, `${what}: got ${got}, want ${want} (rtol ${rtol}, atol ${atol})`);
/** The leading number of a displayed text ("60.55 m", "−3.2 dB"). */
export const shown = (text) => Number(text.replace(/\u2212/g, '-').match(/-?[0-9.]+/)[0]);

/** Opens the page; returns { browser, context, page, requests, problems }. */
export async function open() {
  assert.ok(existsSync(html), `${html} is missing: run bash build.sh first`);
  const executablePath = process.env.CHROMIUM || execSync('command -v chromium', { shell: '/bin/bash' }).toString().trim();
  const browser = await chromium.launch({
    executablePath, headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const context = await browser.newContext({ offline: true, viewport: { width: 1366, height: 768 }, acceptDownloads: true });
  const requests = [];
  const problems = [];
  context.on('request', (r) => requests.push(r.url()));
  await context.route('**/*', (route) => (route.request().url().startsWith('file://') ? route.continue() : route.abort()));
  const page = await context.newPage();
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => { if (m.type() === 'error') problems.push(`console: ${m.text()}`); });
  await page.goto(url);
  await page.waitForSelector('#fault [data-key="distance"]');
  return { browser, context, page, requests, problems };
}

/** Asserts nothing but file://, blob: or data: was requested, and no page errors. */
export function assertQuiet(requests, problems) {
  const remote = requests.filter((u) => !/^(file|blob|data):/.test(u));
  assert.deepEqual(remote, [], 'requests other than file://');
  assert.deepEqual(problems, []);
}
