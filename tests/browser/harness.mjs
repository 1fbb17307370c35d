// Shared test set-up: the static server, headless Debian Chromium via playwright-core,
// console-error collection, and helpers to reach the painted view.
import { chromium } from 'playwright-core';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { startServer } from './server.mjs';

const HERE = path.dirname(fileURLToPath(import.meta.url));
export const OUT = path.resolve(HERE, '../out');
export const CHROMIUM = process.env.CHROMIUM || '/usr/bin/chromium';
const ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update',
  '--disable-sync', '--no-first-run', '--disable-quic'];

export const PHONE = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 1, isMobile: true, hasTouch: true };
export const DESKTOP = { viewport: { width: 1280, height: 800 }, deviceScaleFactor: 1 };

/** A browser with a fresh profile (persistent context so service workers behave as on a phone). */
export async function openBrowser(t, opts = DESKTOP) {
  const server = await startServer();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'nightfield-chromium-'));
  const context = await chromium.launchPersistentContext(dir, { executablePath: CHROMIUM, args: ARGS, headless: true, ...opts });
  const errors = [];
  const watch = (page) => {
    page.on('console', (m) => { if (m.type() === 'error') errors.push(`console: ${m.text()}`); });
    page.on('pageerror', (e) => errors.push(`page: ${e.message}`));
    page.on('dialog', (d) => d.accept());
  };
  context.on('page', watch);
  for (const p of context.pages()) watch(p);
  t.after(async () => { await context.close(); await server.close(); fs.rmSync(dir, { recursive: true, force: true }); });
  const page = context.pages()[0] || (await context.newPage());
  return { server, context, page, errors };
}

/** Go to url and wait until the first view is painted (data-ready="1"). */
export async function gotoReady(page, url) {
  await page.goto(url);
  await page.waitForFunction(() => document.documentElement.dataset.ready === '1' || !document.getElementById('alert').hidden, null, { timeout: 30000 });
  const alert = await page.locator('#alert').textContent();
  if (await page.evaluate(() => document.documentElement.dataset.ready !== '1')) throw new Error(`page not ready; alert says: ${alert}`);
}

/** RGBA bytes of a canvas, for exact comparisons. */
export async function canvasBytes(page, sel = '#view') {
  // Compare finished views only: every data tier loaded and drawn.
  await page.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
  return page.evaluate((s) => {
    const c = document.querySelector(s);
    const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
    let h = 2166136261 >>> 0; // FNV-1a over the pixels: cheap to pass back
    for (let i = 0; i < d.length; i++) { h ^= d[i]; h = Math.imul(h, 16777619) >>> 0; }
    let lit = 0;
    for (let i = 0; i < d.length; i += 4) if (d[i] + d[i + 1] + d[i + 2] > 60) lit++;
    return { w: c.width, h: c.height, hash: h, lit };
  }, sel);
}

export async function screenshot(page, name) {
  fs.mkdirSync(OUT, { recursive: true });
  const file = path.join(OUT, name);
  await page.screenshot({ path: file, fullPage: false });
  return file;
}

/** Wait until the service worker controls the page and the offline cache is filled. */
export async function waitOffline(page) {
  await page.waitForFunction(() => navigator.serviceWorker && navigator.serviceWorker.controller, null, { timeout: 30000 });
  await page.waitForFunction(async () => (await caches.keys()).some((k) => k.startsWith('nightfield-')), null, { timeout: 30000 });
  await page.waitForFunction(() => document.getElementById('offline-chip').textContent === 'ready offline', null, { timeout: 30000 });
}
