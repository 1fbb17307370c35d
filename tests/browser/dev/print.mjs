// Dev helper: the print layout as a screenshot (emulated print media).
import { chromium } from 'playwright-core';
import { startServer } from '../server.mjs';
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const p = await b.newPage({ viewport: { width: 800, height: 1100 } });
await p.goto(s.url);
await p.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
await p.emulateMedia({ media: 'print' });
await p.screenshot({ path: '/tmp/shot-print.png', fullPage: true });
await b.close(); await s.close();
