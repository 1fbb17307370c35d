// The page in headless Chromium: screenshots, kit persistence, share links, bad links.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { openBrowser, gotoReady, canvasBytes, screenshot, PHONE, DESKTOP } from './harness.mjs';
import { linkPayload, readPayload } from './links.mjs';
import jsQR from 'jsqr';

const savedKit = (page) => page.evaluate(() => JSON.parse(localStorage.getItem('nightfield.kit') || 'null'));

test('phone, desktop and night screenshots; view painted; no console errors', async (t) => {
  for (const [name, opts, night] of [['phone', PHONE, false], ['desktop', DESKTOP, false], ['phone-night', PHONE, true]]) {
    const { page, server, errors } = await openBrowser(t, opts);
    if (night) await page.addInitScript(() => localStorage.setItem('nightfield.night', '1'));
    await gotoReady(page, server.url);
    const px = await canvasBytes(page);
    assert.ok(px.lit > 10, `${name}: the view shows stars (${px.lit} lit pixels)`);
    if (night) {
      // Whole page red on black: the body's computed colours have no green/blue.
      const c = await page.evaluate(() => [getComputedStyle(document.body).color, getComputedStyle(document.body).backgroundColor]);
      assert.match(c[0], /^rgb\(\d+, (\d|[1-4]\d), (\d|[1-4]\d)\)$/, `night text colour ${c[0]}`);
      assert.equal(c[1], 'rgb(0, 0, 0)');
    }
    await screenshot(page, `${name}.png`);
    assert.deepEqual(errors, [], `${name}: console errors`);
  }
});

test('night mode is set before first paint (no white flash)', async (t) => {
  const { page, server } = await openBrowser(t, PHONE);
  await page.addInitScript(() => {
    localStorage.setItem('nightfield.night', '1');
    // Record the state at the first moment the body exists.
    new MutationObserver((_, obs) => {
      if (document.body) { window.__firstBodyNight = document.documentElement.dataset.night; window.__firstBg = getComputedStyle(document.documentElement).backgroundColor; obs.disconnect(); }
    }).observe(document, { childList: true, subtree: true });
  });
  await gotoReady(page, server.url);
  assert.equal(await page.evaluate(() => window.__firstBodyNight), '1');
  assert.equal(await page.evaluate(() => window.__firstBg), 'rgb(0, 0, 0)');
});

test('kit add, edit and remove persist across reload', async (t) => {
  const { page, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  await page.click('#tab-kit');
  // Add a 15 mm eyepiece from the generic presets.
  await page.selectOption('#preset', { label: 'Eyepiece: 15 mm 60°' });
  await page.click('#preset-add');
  let kit = await savedKit(page);
  const added = kit.items.find((i) => i.name === '15 mm 60°');
  assert.ok(added, 'added item saved');
  // Edit it: 16 mm, renamed.
  await page.click(`li[data-item="${added.id}"] >> text=Edit`);
  await page.fill('#item-form input[name="name"]', 'Club 16 mm');
  await page.fill('#item-form input[name="focal_mm"]', '16');
  await page.click('#item-form button[type="submit"]');
  // An out-of-range value is refused with a message, and nothing is saved.
  await page.click(`li[data-item="${added.id}"] >> text=Edit`);
  await page.fill('#item-form input[name="focal_mm"]', '400');
  await page.click('#item-form button[type="submit"]');
  assert.match(await page.locator('#alert').textContent(), /Focal length \(mm\).*allowed 1 to 100/);
  await page.click('#item-form >> text=Cancel');
  await page.reload();
  await page.waitForFunction(() => document.documentElement.dataset.ready === '1');
  kit = await savedKit(page);
  const edited = kit.items.find((i) => i.id === added.id);
  assert.equal(edited.name, 'Club 16 mm');
  assert.equal(edited.focal_mm, 16);
  // Remove the demo 32 mm eyepiece; stations drop it too.
  await page.click('#tab-kit');
  await page.click('li[data-item="ep-32"] >> text=Remove');
  await page.reload();
  await page.waitForFunction(() => document.documentElement.dataset.ready === '1');
  kit = await savedKit(page);
  assert.ok(!kit.items.some((i) => i.id === 'ep-32'));
  assert.ok(kit.stations.every((s) => !s.eyepieces.includes('ep-32')));
  assert.equal(kit.schema, 2);
  await page.click('#tab-kit');
  assert.equal(await page.locator('li[data-item="ep-32"]').count(), 0);
  assert.equal(await page.locator(`li[data-item="${added.id}"]`).count(), 1);
  assert.deepEqual(errors.filter((e) => !/allowed 1 to 100/.test(e)), []);
});

test('share link round trip gives identical canvas pixels', async (t) => {
  const a = await openBrowser(t, DESKTOP);
  await gotoReady(a.page, a.server.url);
  // Change something so the link is not just the default.
  await a.page.click('#ep-next');
  await a.page.click('#tab-share');
  const link = await a.page.inputValue('#share-link');
  assert.match(link, /#s=[A-Za-z0-9_-]+$/);
  assert.equal(readPayload(link.split('#s=')[1]).version, 1);
  const before = await canvasBytes(a.page);
  // A second, fresh browser (no saved kit) in another time zone opens the link.
  const b = await openBrowser(t, { ...DESKTOP, timezoneId: 'America/Denver' });
  const url = link.replace(a.server.url, b.server.url);
  await gotoReady(b.page, url);
  const after = await canvasBytes(b.page);
  assert.deepEqual(after, before);
  // The site's clock (its own zone), not the device's, is shown.
  await b.page.click('#tab-site');
  await a.page.click('#tab-site');
  assert.equal(await b.page.inputValue('#site-form input[name="time"]'), await a.page.inputValue('#site-form input[name="time"]'));
  assert.equal(await b.page.inputValue('#site-form input[name="date"]'), await a.page.inputValue('#site-form input[name="date"]'));
  await a.page.click('#tab-share');
  // The QR code on the page reads back as the link (independent decoder: jsqr).
  const qr = await a.page.evaluate(() => {
    const c = document.getElementById('qr');
    return { w: c.width, h: c.height, d: Array.from(c.getContext('2d').getImageData(0, 0, c.width, c.height).data) };
  });
  assert.equal(jsQR(Uint8ClampedArray.from(qr.d), qr.w, qr.h)?.data, link);
  // Night mode: red and black only, dark modules on light (read without inverting).
  await a.page.click('#night-toggle');
  const nq = await a.page.evaluate(() => {
    const c = document.getElementById('qr');
    return { w: c.width, h: c.height, d: Array.from(c.getContext('2d').getImageData(0, 0, c.width, c.height).data) };
  });
  for (let i = 0; i < nq.d.length; i += 4) assert.ok(nq.d[i + 1] <= 0x2a && nq.d[i + 2] <= 0x2a, `non-red QR pixel ${nq.d.slice(i, i + 3)}`);
  // (The link now carries night mode too.)
  const nightLink = await a.page.inputValue('#share-link');
  assert.equal(jsQR(Uint8ClampedArray.from(nq.d), nq.w, nq.h, { inversionAttempts: 'dontInvert' })?.data, nightLink);
  assert.deepEqual([...a.errors, ...b.errors], []);
});

test('a bad link shows role="alert" and the saved kit survives', async (t) => {
  const { page, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  await page.click('#tab-kit');
  await page.selectOption('#preset', { label: 'Binoculars: 10×50 binoculars' });
  await page.click('#preset-add');
  const kitBefore = await savedKit(page);
  const good = linkPayload({ version: 1, anything: true });
  const cases = [
    ['malformed', 'abc$%^'],
    ['truncated', good.slice(0, good.length - 5)],
    ['future version', linkPayload({ version: 99 }, 7)],
  ];
  for (const [what, payload] of cases) {
    await page.goto(`${server.url}#s=${payload}`);
    await page.reload();
    const alert = page.locator('[role="alert"]#alert');
    await alert.waitFor({ state: 'visible', timeout: 20000 });
    const text = await alert.textContent();
    assert.match(text, /share link/i, `${what}: ${text}`);
    assert.match(text, /saved kit and settings are unchanged/, what);
    if (what === 'future version') assert.match(text, /newer Nightfield/);
    assert.deepEqual(await savedKit(page), kitBefore, `${what}: kit unchanged`);
  }
  assert.deepEqual(errors, []);
});

test('a link with another kit asks before replacing the saved kit', async (t) => {
  const a = await openBrowser(t, DESKTOP);
  await gotoReady(a.page, a.server.url);
  await a.page.click('#tab-share');
  const link = await a.page.inputValue('#share-link');
  const b = await openBrowser(t, DESKTOP);
  await gotoReady(b.page, b.server.url);
  // b has its own kit: remove an eyepiece so it differs from a's.
  await b.page.click('#tab-kit');
  await b.page.click('li[data-item="ep-6"] >> text=Remove');
  const kitB = await savedKit(b.page);
  await gotoReady(b.page, link.replace(a.server.url, b.server.url));
  await b.page.reload();
  await b.page.waitForFunction(() => document.documentElement.dataset.ready === '1');
  assert.equal(await b.page.locator('#link-banner').isVisible(), true);
  assert.deepEqual(await savedKit(b.page), kitB, 'opening the link did not touch the saved kit');
  await b.page.click('#link-adopt'); // confirm() is accepted by the harness
  const adopted = await savedKit(b.page);
  assert.ok(adopted.items.some((i) => i.id === 'ep-6'), 'adopted the link kit after asking');
});

test('a dead wasm instance is reported and replaced; nothing saved is lost', async (t) => {
  const { page, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  const kit = await savedKit(page);
  const before = await canvasBytes(page);
  // Make the next render trap the way a Rust panic (panic = abort) does: a WebAssembly.RuntimeError.
  await page.evaluate(async () => {
    const m = await import('/pkg/nightfield.js');
    m.Engine.prototype.render = function () { throw new WebAssembly.RuntimeError('unreachable'); };
  });
  await page.click('#north-up');
  await page.click('#north-up');
  await page.waitForFunction(() => /restarted/.test(document.getElementById('alert').textContent), null, { timeout: 20000 });
  assert.match(await page.locator('#alert').textContent(), /sky engine stopped.*restarted.*Nothing saved was lost/);
  // The new instance (a fresh module record) paints the same view again.
  await page.waitForFunction(() => document.querySelector('#view').getContext('2d').getImageData(0, 0, 1, 1) && true);
  const after = await canvasBytes(page);
  assert.deepEqual(after, before);
  assert.deepEqual(await savedKit(page), kit);
  assert.deepEqual(errors, []);
});

test('the Sun as target shows the solar caution', async (t) => {
  const { page, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  await page.fill('#search', 'Sun');
  await page.click('#search-form button[type="submit"]');
  const c = page.locator('#solar-caution[role="alert"]');
  await c.waitFor({ state: 'visible', timeout: 10000 });
  assert.match(await c.textContent(), /full-aperture solar filter/);
  assert.match(await c.textContent(), /local rules and trained practice/);
  // Back to a night target far from the Sun: the caution goes.
  await page.fill('#search', 'M 45');
  await page.click('#search-form button[type="submit"]');
  await c.waitFor({ state: 'hidden', timeout: 10000 });
  assert.deepEqual(errors, []);
});

test('drag pans the view, the wheel steps eyepieces, re-centre restores', async (t) => {
  const { page, server, errors } = await openBrowser(t, DESKTOP);
  await gotoReady(page, server.url);
  const start = await canvasBytes(page);
  const box = await page.locator('#view').boundingBox();
  const cx = box.x + box.width / 2, cy = box.y + box.height / 2;
  await page.mouse.move(cx, cy);
  await page.mouse.down();
  await page.mouse.move(cx + 60, cy + 25, { steps: 5 });
  await page.mouse.up();
  await page.waitForTimeout(100);
  assert.notEqual((await canvasBytes(page)).hash, start.hash, 'the drag moved the view');
  await page.click('#recentre');
  assert.deepEqual(await canvasBytes(page), start, 're-centred');
  const mag = () => page.locator('#figures dt:text-is("Magnification") + dd').textContent();
  const m0 = await mag();
  await page.mouse.move(cx, cy);
  await page.mouse.wheel(0, -120); // wheel up: more power
  await page.waitForFunction((m) => document.querySelector('#figures').textContent.indexOf(m) < 0, m0);
  const m1 = await mag();
  assert.ok(parseFloat(m1) > parseFloat(m0), `${m0} -> ${m1}`);
  // Pinch in (two pointers closing): back to lower power.
  await page.evaluate(({ cx, cy }) => {
    const c = document.getElementById('view');
    const ev = (type, id, x) => c.dispatchEvent(new PointerEvent(type, { pointerId: id, clientX: x, clientY: cy, bubbles: true, pointerType: 'touch', isPrimary: id === 1 }));
    ev('pointerdown', 1, cx - 100); ev('pointerdown', 2, cx + 100);
    for (let k = 1; k <= 10; k++) { ev('pointermove', 1, cx - 100 + 6 * k); ev('pointermove', 2, cx + 100 - 6 * k); }
    ev('pointerup', 1, cx - 40); ev('pointerup', 2, cx + 40);
  }, { cx, cy });
  await page.waitForFunction((m) => document.querySelector('#figures').textContent.indexOf(m) < 0, m1);
  assert.ok(parseFloat(await mag()) < parseFloat(m1), 'pinch stepped down');
  assert.deepEqual(errors, []);
});

test('kit import: a bad file is refused in words and the kit kept; a good one replaces it after asking', async (t) => {
  const { page, server, errors } = await openBrowser(t, PHONE);
  await gotoReady(page, server.url);
  await page.click('#tab-kit');
  await page.click('li[data-item="ep-6"] >> text=Remove'); // make the saved kit differ from the demo
  const before = await savedKit(page);
  await page.setInputFiles('#kit-import', { name: 'broken.json', mimeType: 'application/json', buffer: Buffer.from('{"schema": 2, "items": [{"id":"x","kind":"eyepiece","focal_mm":-4,"afov_deg":50}], "stations": []}') });
  await page.waitForFunction(() => !document.getElementById('alert').hidden);
  assert.match(await page.locator('#alert').textContent(), /broken\.json.*not imported.*allowed 1 to 100.*unchanged/);
  assert.deepEqual(await savedKit(page), before);
  const good = { format: 'nightfield-kit', schema: 2, items: [
    { id: 'b', kind: 'binocular', name: '7×35 binoculars', aperture_mm: 35, magnification: 7, tfov_deg: 8 }],
    stations: [{ id: 's', name: 'Hand-held', binocular: 'b', eyepieces: [] }] };
  await page.setInputFiles('#kit-import', { name: 'club.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(good)) });
  await page.waitForFunction(() => /Imported 1 items/.test(document.getElementById('kit-note').textContent));
  const after = await savedKit(page);
  assert.equal(after.items.length, 1);
  assert.equal(after.stations[0].binocular, 'b');
  await page.waitForFunction(() => /7×35 binoculars|Hand-held/.test(document.getElementById('view-caption').textContent));
  assert.deepEqual(errors, []);
});
