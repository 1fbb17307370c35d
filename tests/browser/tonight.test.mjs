// "Up tonight" (Target tab) and the view's caption, at the demo scenario's time
// (2026-12-12 20:00 UTC = 21:00 at the demo site, src/scenario.rs demo_scenario).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { openBrowser, gotoReady, screenshot, PHONE } from './harness.mjs';

const DEMO_UTC = '2026-12-12T20:00:00Z';

async function openAtDemoTime(t) {
  const b = await openBrowser(t, PHONE);
  await b.context.addInitScript((w) => {
    if (!localStorage.getItem('nightfield.session')) localStorage.setItem('nightfield.session', JSON.stringify({ v: 1, utc_ms: Date.parse(w) }));
  }, DEMO_UTC);
  await gotoReady(b.page, b.server.url);
  await b.page.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
  await b.page.click('#tab-target');
  await b.page.waitForSelector('#tonight li[data-group]');
  return b;
}

const rowsOf = (page) => page.$$eval('#tonight li[data-group]', (ls) => ls.map((l) => ({
  group: l.dataset.group, name: l.querySelector('button').firstChild.textContent, sub: l.querySelector('.sub').textContent,
})));

test('up tonight: planets first, then showpieces; no NGC/IC stars; compact with more on request', async (t) => {
  const { page, errors } = await openAtDemoTime(t);
  let rows = await rowsOf(page);
  // The Moon and planets lead; Saturn (the brightest planet up at 21:00) first, then Uranus and Neptune.
  assert.equal(rows[0].group, 'bodies', JSON.stringify(rows[0]));
  assert.equal(rows[0].name, 'Saturn');
  assert.match(rows[0].sub, /^\d+° up now · planet · best at/);
  const bodies = rows.filter((r) => r.group === 'bodies').map((r) => r.name);
  for (const p of ['Uranus', 'Neptune']) assert.ok(bodies.includes(p), `${p} in ${bodies}`);
  // Then the deep-sky showpieces: Messier or named objects, the Pleiades among the first.
  const show = rows.filter((r) => r.group === 'showpieces');
  assert.ok(show.length >= 5, `showpieces: ${show.length}`);
  const famous = show.filter((r) => /^M \d|\(/.test(r.name));
  assert.ok(famous.length >= 0.8 * show.length, `Messier or named: ${famous.length} of ${show.length}`);
  assert.ok(show.slice(0, 5).some((r) => r.name.startsWith('M 45')), show.slice(0, 5).map((r) => r.name).join(', '));
  // Compact: 20 rows and a button for more.
  assert.equal(rows.length, 20);
  assert.ok(await page.isVisible('#tonight-more'));
  await page.click('#tonight-more');
  rows = await rowsOf(page);
  assert.ok(rows.length > 20 && rows.length <= 40, `after one "more": ${rows.length}`);
  // Keep opening: the whole list has no star records from NGC/IC (OpenNGC type "*").
  while (await page.isVisible('#tonight-more')) await page.click('#tonight-more');
  rows = await rowsOf(page);
  for (const r of rows) {
    assert.doesNotMatch(r.name, /^(NGC 1990|IC 1318|NGC 771|NGC 7748|IC 1851)\b/, r.name);
    if (/ · star\b/.test(r.sub)) assert.match(r.name, /^M \d/, `star row ${r.name}`);
  }
  // Best times are on the site's clock, inside the list's window (21:00 to 01:00).
  assert.match(await page.textContent('#tonight-note'), /From 21:00/);
  for (const r of rows) {
    const m = / best at (\d\d):(\d\d)/.exec(r.sub);
    assert.ok(m, r.sub);
    const min = ((+m[1] * 60 + +m[2]) - 21 * 60 + 1440) % 1440;
    assert.ok(min <= 240, `${r.name}: best at ${m[1]}:${m[2]} is outside 21:00–01:00`);
  }
  await screenshot(page, 'tonight.png');
  assert.deepEqual(errors, []);
});

test('a tap on an up-tonight row shows that target; the drift is told under the view', async (t) => {
  const { page, errors } = await openAtDemoTime(t);
  await page.click('#tonight li[data-group] button >> text=Saturn');
  await page.waitForFunction(() => /Saturn/.test(document.getElementById('figures').textContent));
  assert.match(await page.textContent('#target-now'), /Saturn/);
  // The drift words sit in the caption (not on the drawing) with the site time of the view.
  const cap = await page.textContent('#view-caption');
  assert.match(cap, /at 21:00/);
  assert.match(cap, /leaves the field in \d/);
  assert.deepEqual(errors, []);
});
