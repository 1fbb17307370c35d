// Dev helper: screenshots of the page (phone, desktop, night) into /tmp; optional tab to open.
//   node tests/browser/dev/shot.mjs [hash] [tab-id] [full]
// Files: ${SHOT_PREFIX}{phone,desktop,night}.png, SHOT_PREFIX=/tmp/shot- unless set (two
// people on one machine each set their own).
import { chromium } from 'playwright-core';
import { startServer } from '../server.mjs';
const [hash = '', tab = '', full = ''] = process.argv.slice(2);
const prefix = process.env.SHOT_PREFIX || '/tmp/shot-';
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const errors = [];
for (const [name, vp, night] of [['phone', { width: 390, height: 844 }, false], ['desktop', { width: 1280, height: 800 }, false], ['night', { width: 390, height: 844 }, true]]) {
  const ctx = await b.newContext({ viewport: vp });
  const p = await ctx.newPage();
  p.on('console', (m) => { if (m.type() === 'error') errors.push(`${name}: ${m.text()}`); });
  p.on('pageerror', (e) => errors.push(`${name} pageerror: ${e.message}`));
  if (night) await p.addInitScript(() => localStorage.setItem('nightfield.night', '1'));
  await p.goto(s.url + hash);
  await p.waitForFunction(() => document.documentElement.dataset.ready === '1' || !document.getElementById('alert').hidden, null, { timeout: 30000 }).catch(() => {});
  if (tab) { await p.click(`#${tab}`); await p.waitForTimeout(300); }
  await p.screenshot({ path: `${prefix}${name}.png`, fullPage: full === 'full' });
  await ctx.close();
}
console.log(errors.join('\n'));
await b.close(); await s.close();
