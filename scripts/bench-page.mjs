// Page timing in headless Chromium (make bench): how soon the first view is painted after the
// wasm engine is instantiated. Medians over fresh page loads (HTTP cache warm, as on a phone's
// second visit); the page sets performance marks nf:wasm-start, nf:wasm-ready, nf:tier-<id>,
// nf:first-paint. Prints figures, asserts nothing (speed is a bench, not a test).
import { chromium } from '../tests/browser/node_modules/playwright-core/index.mjs';
import { startServer } from '../tests/browser/server.mjs';

const runs = process.argv.includes('--quick') ? 3 : 11;
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] });
const ctx = await b.newContext({ viewport: { width: 390, height: 844 }, deviceScaleFactor: 3 });
const rows = [];
for (let i = 0; i < runs + 1; i++) {
  const p = await ctx.newPage();
  await p.goto(s.url);
  await p.waitForFunction(() => document.documentElement.dataset.ready === '1', null, { timeout: 60000 });
  const m = await p.evaluate(() => Object.fromEntries(performance.getEntriesByType('mark').filter((e) => e.name.startsWith('nf:')).map((e) => [e.name, e.startTime])));
  if (i > 0) rows.push(m); // the first load fills the HTTP cache
  await p.close();
}
await b.close(); await s.close();
const med = (f) => { const v = rows.map(f).sort((a, c) => a - c); return v[v.length >> 1]; };
const inst = med((m) => m['nf:wasm-ready'] - m['nf:wasm-start']);
const toPaint = med((m) => m['nf:first-paint'] - m['nf:wasm-ready']);
const bright = med((m) => (m['nf:tier-bright'] ?? m['nf:first-paint']) - m['nf:wasm-ready']);
const total = med((m) => m['nf:first-paint']);
console.log(`[bench] page (phone viewport, dpr 3, median of ${rows.length} warm loads)`);
console.log(`[bench]   wasm fetch + instantiate           ${inst.toFixed(1)} ms`);
console.log(`[bench]   instantiated → bright tier loaded  ${bright.toFixed(1)} ms`);
console.log(`[bench]   instantiated → first view painted  ${toPaint.toFixed(1)} ms (${(toPaint / inst).toFixed(2)}× the instantiation)`);
console.log(`[bench]   navigation → first view painted    ${total.toFixed(1)} ms`);
