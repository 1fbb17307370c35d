// Dev helper: a phone at device pixel ratio 3; prints time to first view and any console errors.
import { chromium } from 'playwright-core';
import { startServer } from '../server.mjs';
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const ctx = await b.newContext({ viewport: { width: 390, height: 844 }, deviceScaleFactor: 3, isMobile: true, hasTouch: true });
const p = await ctx.newPage();
const errors = [];
p.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
const t0 = Date.now();
await p.goto(s.url);
await p.waitForFunction(() => document.documentElement.dataset.ready === '1', null, { timeout: 60000 });
const t1 = Date.now();
await p.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
console.log(`first view ${t1 - t0} ms, all tiers ${Date.now() - t0} ms; canvas`, await p.evaluate(() => document.getElementById('view').width), errors);
await p.screenshot({ path: '/tmp/shot-dpr3.png' });
await b.close(); await s.close();
