// Kit schema, migration, import validation and the site clock (www/js/kit.js, time.js), in Node.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { demoKit, validateKit, migrate, loadKit, saveKit, importKitText, exportKitText, removeItem, KIT_KEY, BACKUP_KEY, KitError } from '../../www/js/kit.js';
import { zonedToUtcMs, utcToZoned, eventHours, zoneOffsetMs } from '../../www/js/time.js';
import { trainFor } from '../../www/js/scenario.js';

class MemStore { constructor() { this.m = new Map(); } getItem(k) { return this.m.has(k) ? this.m.get(k) : null; } setItem(k, v) { this.m.set(k, String(v)); } }

test('demo kit is valid and survives export/import unchanged', () => {
  const k = validateKit(demoKit());
  assert.deepEqual(importKitText(exportKitText(k)), k);
});

test('schema 1 kits migrate to schema 2, the old copy is kept', () => {
  const v1 = { version: 1, telescopes: [{ id: 't', name: 'old scope', aperture_mm: 114, focal_mm: 900, design: 'newtonian', mount: 'equatorial' }],
    eyepieces: [{ id: 'e1', name: '20 mm', focal_mm: 20, afov_deg: 50 }] };
  const s = new MemStore();
  s.setItem(KIT_KEY, JSON.stringify(v1));
  const { kit, problem } = loadKit(s);
  assert.equal(problem, null);
  assert.equal(kit.schema, 2);
  assert.deepEqual(kit.stations[0].eyepieces, ['e1']);
  assert.equal(JSON.parse(s.getItem(KIT_KEY)).schema, 2);
  assert.deepEqual(JSON.parse(s.getItem(`${KIT_KEY}.v1`)), v1);
});

test('an unreadable saved kit is never overwritten by the demo', () => {
  const s = new MemStore();
  s.setItem(KIT_KEY, '{"schema": 2, "items": [ broken');
  const r = loadKit(s);
  assert.match(r.problem, /could not be read/);
  assert.equal(s.getItem(KIT_KEY), '{"schema": 2, "items": [ broken');
  assert.equal(s.getItem(BACKUP_KEY), '{"schema": 2, "items": [ broken');
});

test('import errors are in plain words', () => {
  const cases = [
    ['not json', /not valid JSON/],
    ['{"format":"other-app"}', /not a Nightfield kit file/],
    ['{"schema": 9, "items": [], "stations": []}', /newer Nightfield/],
    ['{"schema": 2, "items": [{"id":"a","kind":"eyepiece","name":"x","focal_mm":500,"afov_deg":50}], "stations": []}', /Focal length \(mm\)" is 500; allowed 1 to 100/],
    ['{"schema": 2, "items": [{"id":"a","kind":"rocket"}], "stations": []}', /kind "rocket"; allowed/],
    ['{"schema": 2, "items": [], "stations": [{"name":"S","telescope":"nope"}]}', /refers to a telescope "nope"/],
  ];
  for (const [text, re] of cases) assert.throws(() => importKitText(text), (e) => e instanceof KitError && re.test(e.message), text);
});

test('saving validates first, so a bad edit cannot replace the saved kit', () => {
  const s = new MemStore();
  saveKit(demoKit(), s);
  const before = s.getItem(KIT_KEY);
  const bad = demoKit();
  bad.items[0].aperture_mm = -3;
  assert.throws(() => saveKit(bad, s), KitError);
  assert.equal(s.getItem(KIT_KEY), before);
});

test('removing an item drops it from stations; a station without optics goes', () => {
  const k = removeItem(demoKit(), 'tel-b');
  assert.equal(k.stations.length, 1);
  const k2 = removeItem(demoKit(), 'ep-10');
  assert.ok(k2.stations.every((st) => !st.eyepieces.includes('ep-10')));
});

test('site clock: wall time in the site zone <-> UTC (Intl), across DST', () => {
  // Europe/Zurich: CET = UTC+1 in winter, CEST = UTC+2 in summer (common practice).
  assert.equal(new Date(zonedToUtcMs('2026-12-05', '21:30', 'Europe/Zurich')).toISOString(), '2026-12-05T20:30:00.000Z');
  assert.equal(new Date(zonedToUtcMs('2026-07-05', '21:30', 'Europe/Zurich')).toISOString(), '2026-07-05T19:30:00.000Z');
  // America/Denver: MST = UTC-7; a site's own zone is used, not the device's.
  assert.equal(new Date(zonedToUtcMs('2026-12-05', '21:30', 'America/Denver')).toISOString(), '2026-12-06T04:30:00.000Z');
  assert.deepEqual(utcToZoned(Date.UTC(2026, 11, 6, 4, 30), 'America/Denver'), { date: '2026-12-05', time: '21:30' });
  assert.equal(zoneOffsetMs(Date.UTC(2026, 0, 1), 'Asia/Kolkata'), 5.5 * 3600e3);
  assert.deepEqual(eventHours('22:00', '01:00'), ['22:00', '23:00', '00:00', '01:00']);
});

test('a station becomes an optics train in light-path order', () => {
  const k = demoKit();
  const tr = trainFor(k, k.stations[1], 1);
  assert.equal(tr.instrument.kind, 'telescope');
  assert.equal(tr.instrument.focal_length_mm, 600);
  assert.deepEqual(tr.accessories.map((a) => a.kind), ['star_diagonal', 'eyepiece']);
  assert.equal(tr.accessories[1].focal_length_mm, 10);
});
