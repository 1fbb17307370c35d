// Dev helper: the Sun caution at phone size, field and night themes: the Sun as target,
// and a night target while the Sun is up (site time 14:00). Screenshots /tmp/sun-*.png.
import { chromium } from 'playwright-core';
import { startServer } from '../server.mjs';
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const errors = [];
for (const night of [false, true]) {
  const ctx = await b.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
  const p = await ctx.newPage();
  p.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  if (night) await p.addInitScript(() => localStorage.setItem('nightfield.night', '1'));
  await p.goto(s.url);
  await p.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
  await p.fill('#search', 'Sun'); await p.click('#search-form button[type=submit]');
  await p.waitForTimeout(500); await p.evaluate(() => window.scrollTo(0, 0));
  await p.screenshot({ path: `/tmp/sun-target${night ? '-night' : ''}.png` });
  await p.fill('#search', 'Jupiter'); await p.click('#search-form button[type=submit]');
  await p.click('#tab-site'); await p.fill('#site-form input[name="time"]', '14:00'); await p.dispatchEvent('#site-form input[name="time"]', 'change');
  await p.waitForTimeout(500); await p.evaluate(() => window.scrollTo(0, 0));
  await p.screenshot({ path: `/tmp/sun-up${night ? '-night' : ''}.png` });
  console.log(night ? 'night:' : 'day:', await p.locator('#solar-caution').innerText());
  await ctx.close();
}
console.log(errors.join('\n'));
await b.close(); await s.close();
