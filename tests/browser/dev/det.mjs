import { chromium } from 'playwright-core';
import { startServer } from '../server.mjs';
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
for (let i = 0; i < 2; i++) {
  const ctx = await b.newContext({ viewport: { width: 1280, height: 800 } });
  const p = await ctx.newPage();
  await p.goto(s.url);
  for (const k of ['ready', 'allData']) { await p.waitForFunction((k) => document.documentElement.dataset[k] === '1', k, { timeout: 60000 }); console.log(k, await p.locator('#figures').textContent()); }
  await ctx.close();
}
await b.close(); await s.close();
