// Offline use: after one visit the page renders with the network off; a new worker version
// announces itself and the saved kit survives the update.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { openBrowser, gotoReady, canvasBytes, waitOffline, PHONE } from './harness.mjs';
import { WWW } from './server.mjs';

test('offline reload still renders the same view', async (t) => {
  const { page, context, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  await waitOffline(page);
  const online = await canvasBytes(page);
  const tiers = await page.$$eval('#tiers li', (lis) => lis.map((l) => [l.dataset.tier, l.dataset.ready]));
  assert.ok(tiers.length >= 2 && tiers.every(([, r]) => r === '1'), `tiers ${JSON.stringify(tiers)}`);
  await context.setOffline(true);
  const before = server.requests.length;
  await page.reload();
  await page.waitForFunction(() => document.documentElement.dataset.ready === '1', null, { timeout: 30000 });
  const offline = await canvasBytes(page);
  assert.deepEqual(offline, online);
  assert.equal(server.requests.length, before, `no request reached the server: ${server.requests.slice(before)}`);
  assert.deepEqual(errors, []);
});

test('a new service worker version is announced and keeps the kit', async (t) => {
  const { page, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  await waitOffline(page);
  await page.click('#tab-kit');
  await page.selectOption('#preset', { label: 'Camera: small-sensor camera, 1920×1080, 2.9 µm' });
  await page.click('#preset-add');
  const kit = await page.evaluate(() => localStorage.getItem('nightfield.kit'));
  // Serve a changed worker (new VERSION), as a new release would.
  const sw = fs.readFileSync(path.join(WWW, 'sw.js'), 'utf8');
  const bumped = sw.replace(/const VERSION = '([^']+)'/, (_, v) => `const VERSION = '${v}-next'`);
  assert.notEqual(bumped, sw);
  server.override('/sw.js', bumped);
  await page.reload();
  await page.locator('#update-banner').waitFor({ state: 'visible', timeout: 30000 });
  await Promise.all([page.waitForEvent('load'), page.click('#update-apply')]);
  await page.waitForFunction(() => document.documentElement.dataset.ready === '1', null, { timeout: 30000 });
  await page.waitForFunction(async () => (await caches.keys()).some((k) => k.endsWith('-next')), null, { timeout: 30000 });
  const keys = await page.evaluate(() => caches.keys());
  assert.ok(keys.every((k) => k.endsWith('-next')), `old cache removed: ${keys}`);
  assert.equal(await page.evaluate(() => localStorage.getItem('nightfield.kit')), kit);
  assert.deepEqual(errors, []);
});
