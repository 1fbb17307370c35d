// Dev helper: walks every tab at phone, desktop and night sizes, full-page screenshots into
// /tmp/w/{mode}-{tab}.png, and lists small touch targets (< 44 px), horizontal overflow and
// light backgrounds in night mode.   node tests/browser/dev/walk.mjs [hash] [date-time-utc]
import { chromium } from 'playwright-core';
import fs from 'node:fs';
import { startServer } from '../server.mjs';
const [hash = '', when = ''] = process.argv.slice(2);
fs.mkdirSync('/tmp/w', { recursive: true });
const s = await startServer();
const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
const errors = [];
const TABS = ['tab-target', 'tab-kit', 'tab-site', 'tab-plan', 'tab-share', 'tab-offline'];
for (const [mode, vp, night] of [['phone', { width: 390, height: 844 }, false], ['desktop', { width: 1280, height: 800 }, false], ['night', { width: 390, height: 844 }, true]]) {
  const ctx = await b.newContext({ viewport: vp, isMobile: mode !== 'desktop', hasTouch: mode !== 'desktop' });
  const p = await ctx.newPage();
  p.on('console', (m) => { if (m.type() === 'error') errors.push(`${mode}: ${m.text()}`); });
  p.on('pageerror', (e) => errors.push(`${mode} pageerror: ${e.message}`));
  if (night) await p.addInitScript(() => localStorage.setItem('nightfield.night', '1'));
  if (when) await p.addInitScript((w) => { if (!localStorage.getItem('nightfield.session')) localStorage.setItem('nightfield.session', JSON.stringify({ v: 1, utc_ms: Date.parse(w) })); }, when);
  await p.goto(s.url + hash);
  await p.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 }).catch(() => {});
  for (const tab of TABS) {
    await p.click(`#${tab}`); await p.waitForTimeout(300);
    if (tab === 'tab-plan') { await p.click('#plan-go'); await p.waitForTimeout(2500); }
    if (tab === 'tab-target') { await p.click('#find-go'); await p.waitForTimeout(500); }
    // Full page in viewport-high pieces: {mode}-{tab}-{n}.png (easier to look at than one tall strip).
    const H = await p.evaluate(() => { window.scrollTo(0, 0); return document.documentElement.scrollHeight; });
    for (let y = 0, n = 0; y < H && n < 12; y += vp.height, n++) {
      await p.screenshot({ path: `/tmp/w/${mode}-${tab.slice(4)}-${n}.png`, fullPage: true, clip: { x: 0, y, width: vp.width, height: Math.min(vp.height, H - y) } });
    }
    const report = await p.evaluate((night) => {
      const out = [];
      const W = document.documentElement.clientWidth;
      for (const e of document.querySelectorAll('button, a, input, select, label.switch, label.filebtn, summary')) {
        const r = e.getBoundingClientRect();
        if (!r.width || !r.height || e.closest('[hidden]')) continue;
        const st = getComputedStyle(e);
        if (st.visibility === 'hidden' || st.display === 'none') continue;
        if (e.matches('input[type=file], .sr, .sr *, label > input[type=checkbox]')) continue;
        const name = `${e.tagName.toLowerCase()}#${e.id || ''}.${e.className || ''} "${(e.textContent || e.value || e.placeholder || '').trim().slice(0, 30)}"`;
        if (r.height < 44 || r.width < 44) out.push(`small ${Math.round(r.width)}x${Math.round(r.height)} ${name}`);
      }
      for (const e of document.querySelectorAll('body *')) {
        const r = e.getBoundingClientRect();
        if (!r.width || e.closest('.tabs')) continue;
        if (r.right > W + 1) out.push(`overflow right=${Math.round(r.right)} > ${W}: ${e.tagName.toLowerCase()}#${e.id}.${e.className}`);
      }
      if (night) {
        for (const e of document.querySelectorAll('body, body *')) {
          const st = getComputedStyle(e);
          for (const c of [st.backgroundColor, st.color, st.borderTopColor]) {
            const m = c.match(/rgba?\((\d+), (\d+), (\d+)(?:, ([\d.]+))?/);
            if (!m || m[4] === '0') continue;
            const [r, g, bl] = [+m[1], +m[2], +m[3]];
            if ((g > 60 || bl > 60) && e.getBoundingClientRect().width) { out.push(`not red: ${c} on ${e.tagName.toLowerCase()}#${e.id}.${e.className}`); break; }
          }
        }
      }
      return [...new Set(out)];
    }, night);
    console.log(`--- ${mode} ${tab}`); for (const l of report) console.log('  ' + l);
  }
  await ctx.close();
}
console.log(errors.join('\n'));
await b.close(); await s.close();
