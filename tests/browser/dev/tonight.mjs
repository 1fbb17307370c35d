// Dev helper: the "Up tonight" list at a given UTC time (default: the demo scenario's),
// phone size, screenshots /tmp/tonight-{n}.png of the list and the rows as text.
//   node tests/browser/dev/tonight.mjs [2026-12-12T20:00:00Z] [night]
import { chromium } from 'playwright-core';
import { startServer } from '../server.mjs';
const [when = '2026-12-12T20:00:00Z', night = ''] = process.argv.slice(2);
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const ctx = await b.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
const p = await ctx.newPage();
const errors = [];
p.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
p.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
await p.addInitScript((w) => localStorage.setItem('nightfield.session', JSON.stringify({ v: 1, utc_ms: Date.parse(w) })), when);
if (night) await p.addInitScript(() => localStorage.setItem('nightfield.night', '1'));
await p.goto(s.url);
await p.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
await p.waitForTimeout(300);
const t0 = Date.now();
const ms = await p.evaluate(() => { const t = performance.now(); document.getElementById('tab-target').click(); return performance.now() - t; });
console.log(`tab switch with list: ${ms.toFixed(0)} ms`);
await p.locator('#tonight').scrollIntoViewIfNeeded();
await p.evaluate(() => document.querySelector('h2:nth-of-type(2)')?.scrollIntoView());
await p.screenshot({ path: '/tmp/tonight-0.png' });
await p.evaluate(() => window.scrollBy(0, 700));
await p.screenshot({ path: '/tmp/tonight-1.png' });
console.log(await p.locator('#tonight-note').textContent());
console.log((await p.$$eval('#tonight li', (ls) => ls.map((l) => (l.className === 'group' ? '## ' : '  ') + l.innerText.replace(/\n/g, ' | ')))).join('\n'));
console.log('more:', await p.locator('#tonight-more').isVisible(), await p.locator('#tonight-more').textContent());
console.log(errors.join('\n'));
await b.close(); await s.close();
