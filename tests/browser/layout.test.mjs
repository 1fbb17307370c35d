// Every tab at phone size (field and night themes) and at desktop size: touch targets of at
// least 44 px, nothing wider than the screen, all six tabs on screen, and in night mode no
// colour with more than a trace of green or blue anywhere on the page (form controls'
// placeholders, accents and option lists included).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { openBrowser, gotoReady, PHONE, DESKTOP } from './harness.mjs';

const TABS = ['tab-target', 'tab-kit', 'tab-site', 'tab-plan', 'tab-share', 'tab-offline'];

/** Problems on the page as it is now: small targets, overflow, and (night) non-red colours. */
function audit(night) {
  const out = [];
  const W = document.documentElement.clientWidth;
  const shown = (e) => { const r = e.getBoundingClientRect(); return r.width > 0 && r.height > 0 && !e.closest('[hidden]'); };
  const name = (e) => `${e.tagName.toLowerCase()}#${e.id}.${e.className} "${(e.textContent || e.value || '').trim().slice(0, 24)}"`;
  // Checkboxes are reached through their whole label (itself checked here).
  for (const e of document.querySelectorAll('button, a, input:not([type=checkbox]):not([type=file]), select, label.switch, label.filebtn, summary')) {
    if (!shown(e)) continue;
    const r = e.getBoundingClientRect();
    if (r.width < 44 || r.height < 44) out.push(`small ${Math.round(r.width)}×${Math.round(r.height)}: ${name(e)}`);
  }
  for (const e of document.querySelectorAll('body *')) {
    if (!shown(e)) continue;
    if (e.getBoundingClientRect().right > W + 1) out.push(`wider than the screen: ${name(e)}`);
  }
  if (night) {
    for (const e of document.querySelectorAll('html, body, body *')) {
      if (!shown(e) && e !== document.documentElement) continue;
      const st = getComputedStyle(e);
      for (const c of [st.color, st.backgroundColor, st.borderTopColor, st.outlineColor]) {
        const m = /rgba?\((\d+), (\d+), (\d+)(?:, ([\d.]+))?\)/.exec(c);
        if (!m || m[4] === '0') continue;
        if (+m[2] > 0x30 || +m[3] > 0x30) { out.push(`not red: ${c} on ${name(e)}`); break; }
      }
    }
    // Form controls: what the browser draws from them besides the box (the placeholder,
    // the accent of checkboxes, radios and sliders, the option list of a closed select,
    // which the loop above skips as not shown).
    for (const e of document.querySelectorAll('input, select, textarea, option, optgroup')) {
      const inList = e.tagName === 'OPTION' || e.tagName === 'OPTGROUP';
      if (!inList && !shown(e)) continue;
      const st = getComputedStyle(e);
      const parts = inList ? [st.color, st.backgroundColor] : [st.accentColor, st.caretColor, getComputedStyle(e, '::placeholder').color];
      if (!inList && !/dark/.test(st.colorScheme)) out.push(`not a dark color-scheme (${st.colorScheme}) on ${name(e)}`);
      for (const c of parts) {
        const m = /rgba?\((\d+), (\d+), (\d+)(?:, ([\d.]+))?\)/.exec(c);
        if (!m) { out.push(`not red: ${c} on ${name(e)}`); break; }
        if (m[4] === '0') continue;
        if (+m[2] > 0x30 || +m[3] > 0x30) { out.push(`not red: ${c} on ${name(e)}`); break; }
      }
    }
  }
  return out;
}

for (const [label, opts, night] of [['phone', PHONE, false], ['phone, night', PHONE, true], ['desktop', DESKTOP, false]]) {
  test(`every tab (${label}): 44 px touch targets, nothing off screen${night ? ', red only' : ''}`, async (t) => {
    const { page, server, errors } = await openBrowser(t, opts);
    if (night) await page.addInitScript(() => localStorage.setItem('nightfield.night', '1'));
    await gotoReady(page, server.url);
    await page.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
    // The six tabs fit on the screen (none hidden off to the side).
    const W = await page.evaluate(() => document.documentElement.clientWidth);
    for (const id of TABS) {
      const r = await page.locator(`#${id}`).boundingBox();
      assert.ok(r.x >= 0 && r.x + r.width <= W + 0.5, `${id} off screen: ${JSON.stringify(r)}`);
    }
    const problems = [];
    for (const id of TABS) {
      await page.click(`#${id}`);
      if (id === 'tab-target') { await page.click('#find-go'); await page.waitForSelector('#find-out p'); }
      if (id === 'tab-plan') {
        await page.click('#safety summary');
        await page.click('#plan-go');
        await page.waitForSelector('#plan-out .card');
      }
      for (const p of await page.evaluate(audit, night)) problems.push(`${id}: ${p}`);
    }
    assert.deepEqual([...new Set(problems)], []);
    assert.deepEqual(errors, []);
  });
}
