// Dev helper: the view of one target (search box), optionally at a site time (hour button), to /tmp/target-<name>.png.
//   node tests/browser/dev/target.mjs M42 [hour-button-text] [night]
import { chromium } from 'playwright-core';
import { startServer } from '../server.mjs';
const [target = 'M42', hour = '', night = ''] = process.argv.slice(2);
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const ctx = await b.newContext({ viewport: { width: 1280, height: 800 } });
const p = await ctx.newPage();
const errors = [];
p.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
if (night) await p.addInitScript(() => localStorage.setItem('nightfield.night', '1'));
await p.goto(s.url);
await p.waitForFunction(() => document.documentElement.dataset.ready === '1', null, { timeout: 30000 });
if (hour) { await p.click('#tab-site'); await p.click(`#hours button:has-text("${hour}")`); await p.click('#tab-target'); }
await p.fill('#search', target); await p.click('#search-form button[type=submit], #search-form button');
await p.waitForTimeout(4000);
await p.locator('#view').screenshot({ path: `/tmp/target-${target.replace(/\W/g, '')}.png` });
console.log(await p.locator('#figures').innerText());
console.log(errors.join('\n'));
await b.close(); await s.close();
