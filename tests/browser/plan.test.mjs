// The Plan tab (station cards, the safety card, print view) and the find card, in the page.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { openBrowser, gotoReady, screenshot, PHONE } from './harness.mjs';

test('the event plan gives a card per station and the safety card; print view shows only the cards', async (t) => {
  const { page, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  await page.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
  await page.click('#tab-plan');
  // The safety card is there before any plan is made: one tap opens it (the engine's card).
  await page.click('#safety summary');
  const safety = await page.textContent('#safety');
  for (const re of [/Safety on the field/, /full-aperture solar filter/, /local rules and trained practice/, /Laser pointers only as local law allows/i, /ladders/, /Cables/]) {
    assert.match(safety, re);
  }
  await page.click('#plan-go');
  await page.waitForSelector('#plan-out .card');
  const titles = await page.$$eval('#plan-out .card h3', (hs) => hs.map((h) => h.textContent));
  // The demo kit has two stations: two station cards.
  assert.equal(titles.length, 2, `cards: ${titles.join(' | ')}`);
  // Each showing names the eyepiece to use (the trains are named after them).
  const facts = await page.$$eval('#plan-out .entry .facts li:first-child', (ls) => ls.map((l) => l.textContent));
  for (const f of facts) assert.match(f, /^\d+ mm \d+° eyepiece.*: \d+×, field/, f);
  // Every scheduled showing names a time window inside the event hours (19:00–23:00 in the demo).
  const times = await page.$$eval('#plan-out .entry h4', (hs) => hs.map((h) => h.textContent.slice(0, 11)));
  assert.ok(times.length > 0);
  for (const w of times) assert.match(w, /^(19|2[0-3]):[0-5]\d–(19|2[0-3]):[0-5]\d$/, w);
  await page.emulateMedia({ media: 'print' });
  await page.evaluate(() => document.body.classList.add('print-cards'));
  assert.equal(await page.isVisible('#view'), false, 'print view hides the eyepiece view');
  assert.equal(await page.isVisible('#plan-out'), true);
  assert.equal(await page.isVisible('#safety-items'), true, 'the safety card prints too');
  await screenshot(page, 'plan-print.png');
  // One print-view picture per card.
  const cards = await page.$$('#plan-out .card');
  for (const [i, c] of cards.entries()) await c.screenshot({ path: new URL(`../out/plan-card-${i + 1}.png`, import.meta.url).pathname });
  assert.deepEqual(errors, []);
});

test('the find card says where to look and how to hop there', async (t) => {
  const { page, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  await page.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
  await page.click('#find-go');
  await page.waitForSelector('#find-out p');
  const text = await page.textContent('#find-out');
  assert.match(text, /(north|south|east|west)/i, text);
  assert.match(text, /angle gauge/i, text);
  // The finder's picture is drawn by the engine (lit pixels in the canvas).
  const lit = await page.evaluate(() => {
    const c = document.querySelector('#find-out canvas');
    const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
    let n = 0;
    for (let i = 0; i < d.length; i += 4) if (d[i] > 120) n++;
    return n;
  });
  assert.ok(lit > 50, `finder view lit pixels: ${lit}`);
  await screenshot(page, 'find-card.png');
  assert.deepEqual(errors, []);
});
