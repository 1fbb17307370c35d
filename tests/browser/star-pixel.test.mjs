// Issue 2's end-to-end check: the brightest catalog star of a known field lands on the canvas
// pixel computed here, independently of the Rust code, from the catalog file (our own reader,
// starfile.mjs), linear proper motion, IAU 1976 precession (checked equal to ERFA pmat76) and the
// gnomonic projection, with the view conventions of src/render (chart view: north up, east left;
// field fitted to 94 % of the shorter side; centre at the buffer centre; pixel (i, j) covers [i, i+1)).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { openBrowser, gotoReady, DESKTOP } from './harness.mjs';
import { linkPayload } from './links.mjs';
import { readStars } from './starfile.mjs';
import { properMotion, precess, gnomonic, separation } from './sky.mjs';
import { toScenario } from '../../www/js/scenario.js';

const HERE = path.dirname(fileURLToPath(import.meta.url));
const D = Math.PI / 180;

// A known field: 0.35° south-west of Capella (HIP 24608), a December evening, an invented site.
const UTC_MS = Date.UTC(2026, 11, 5, 20, 0, 0);
const FIELD_STOP_MM = 27, FOCAL_MM = 1200; // true field = stop / focal length (exact, no eyepiece model)

function scenario(pointing) {
  const kit = {
    schema: 2, owner: 'test', items: [
      { id: 't', kind: 'telescope', name: '200/1200 Newtonian', aperture_mm: 200, focal_mm: FOCAL_MM, design: 'newtonian', mount: 'alt_az' },
      { id: 'e', kind: 'eyepiece', name: '25 mm with 27 mm stop', focal_mm: 25, afov_deg: 62, field_stop_mm: FIELD_STOP_MM },
    ],
    stations: [{ id: 's', name: 'Test station', telescope: 't', binocular: null, diagonal: null, barlow: null, camera: null, eyepieces: ['e'] }],
  };
  return toScenario({
    kit, stationId: 's', eyepieceIndex: 0, utc_ms: UTC_MS,
    site: { name: 'Test field (invented)', lat_deg: 47.05, lon_deg: 8.3, elev_m: 560, tz: 'Europe/Zurich' },
    target: { ra_deg: pointing.ra_rad / D, dec_deg: pointing.dec_rad / D },
    view: { north_up: true, night: false, labels: false },
  });
}

test('brightest star of the field lands on the expected pixel (within 2 px)', async (t) => {
  const cat = readStars(path.resolve(HERE, '../../catalog/stars_bright.nfs'));
  const capella = cat.stars.find((s) => s.hip === 24608);
  assert.ok(capella, 'Capella is in the bright tier');
  const pointing = { ra_rad: capella.ra_rad - (0.25 * D) / Math.cos(capella.dec_rad), dec_rad: capella.dec_rad - 0.25 * D };

  // Expected: every catalog star inside the field, moved to the date, precessed, projected.
  const jyear = 2000 + (UTC_MS / 86400000 + 2440587.5 - 2451545.0) / 365.25;
  const centre = precess(pointing, jyear);
  const radius = FIELD_STOP_MM / 2 / FOCAL_MM;
  const inField = cat.stars
    .map((s) => ({ s, p: precess(properMotion(s, cat.epoch_jyear, jyear), jyear) }))
    .filter(({ p }) => separation(p, centre) < radius * 0.98)
    .sort((a, b) => a.s.vmag - b.s.vmag);
  assert.equal(inField[0].s.hip, 24608, 'Capella is the brightest star of this field');
  const off = gnomonic(inField[0].p, centre);

  const { page, server, errors } = await openBrowser(t, DESKTOP);
  await gotoReady(page, `${server.url}#s=${linkPayload(scenario(pointing))}`);
  await page.waitForFunction(() => document.documentElement.dataset.allData === '1', null, { timeout: 60000 });
  const got = await page.evaluate(() => {
    const c = document.getElementById('view');
    const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
    // The brightest star is the most light in a 9×9 box, not the brightest pixel: every
    // star bright enough to saturate its core has pixels at full white.
    const W = c.width, H = c.height, sat = new Float64Array((W + 1) * (H + 1));
    for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) {
      const i = (y * W + x) * 4;
      sat[(y + 1) * (W + 1) + x + 1] = d[i] + d[i + 1] + d[i + 2] + sat[y * (W + 1) + x + 1] + sat[(y + 1) * (W + 1) + x] - sat[y * (W + 1) + x];
    }
    let best = -1, bx = 0, by = 0;
    for (let y = 4; y < H - 4; y++) for (let x = 4; x < W - 4; x++) {
      const box = sat[(y + 5) * (W + 1) + x + 5] - sat[(y - 4) * (W + 1) + x + 5] - sat[(y + 5) * (W + 1) + x - 4] + sat[(y - 4) * (W + 1) + x - 4];
      if (box > best) { best = box; bx = x; by = y; }
    }
    // Intensity-weighted centroid (pixel centres at i + 0.5) above the box's faintest level,
    // in a 41 px box re-centred on the centroid a few times: a bright star's core is a
    // saturated plateau, so the first peak pixel is its top-left corner, not its centre.
    let cx = bx + 0.5, cy = by + 0.5, sw = 0, sx = 0, sy = 0;
    for (let pass = 0; pass < 4; pass++) {
      const x0 = Math.max(0, Math.floor(cx) - 20), x1 = Math.min(c.width - 1, Math.floor(cx) + 20);
      const y0 = Math.max(0, Math.floor(cy) - 20), y1 = Math.min(c.height - 1, Math.floor(cy) + 20);
      let floor = Infinity;
      for (let y = y0; y <= y1; y++) for (let x = x0; x <= x1; x++) {
        const i = (y * c.width + x) * 4; floor = Math.min(floor, d[i] + d[i + 1] + d[i + 2]);
      }
      sw = 0; sx = 0; sy = 0;
      for (let y = y0; y <= y1; y++) for (let x = x0; x <= x1; x++) {
        const i = (y * c.width + x) * 4, v = d[i] + d[i + 1] + d[i + 2] - floor;
        sw += v; sx += v * (x + 0.5); sy += v * (y + 0.5);
      }
      cx = sx / sw; cy = sy / sw;
    }
    return { w: c.width, h: c.height, x: sx / sw, y: sy / sw, peak: best };
  });
  const s = (Math.min(got.w, got.h) / (2 * radius)) * 0.94;
  const want = { x: got.w / 2 - off.east * s, y: got.h / 2 - off.north * s };
  const miss = Math.hypot(got.x - want.x, got.y - want.y);
  t.diagnostic(`canvas ${got.w}×${got.h}; expected (${want.x.toFixed(2)}, ${want.y.toFixed(2)}), found (${got.x.toFixed(2)}, ${got.y.toFixed(2)}): ${miss.toFixed(2)} px`);
  assert.ok(Math.hypot(off.east, off.north) * s > 50, 'the star sits well off the centre');
  assert.ok(miss <= 2, `star lands ${miss.toFixed(2)} px from the expected pixel`);
  assert.deepEqual(errors, []);
});
