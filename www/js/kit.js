// The kit: equipment items and stations, saved on this device with a versioned schema.
// Schema history: 1 = items + one implicit station (flat lists), 2 = items + named stations.
// Saving never drops data we cannot read: an unreadable stored kit is kept under BACKUP_KEY.

export const KIT_SCHEMA = 2;
export const KIT_KEY = 'nightfield.kit';
export const BACKUP_KEY = 'nightfield.kit.unreadable';
export const FILE_FORMAT = 'nightfield-kit';

// Field definitions per kind: [key, label, min, max, required]. Units in the key names.
export const KINDS = {
  telescope: { label: 'Telescope', fields: [['aperture_mm', 'Aperture (mm)', 10, 2000, true], ['focal_mm', 'Focal length (mm)', 50, 20000, true]],
    choices: { design: [['refractor', 'refractor'], ['newtonian', 'Newtonian'], ['schmidt_cassegrain', 'Schmidt-Cassegrain'], ['maksutov_cassegrain', 'Maksutov-Cassegrain'], ['classical_cassegrain', 'classical Cassegrain']],
      mount: [['alt_az', 'alt-azimuth'], ['dobsonian', 'Dobsonian (rocker box)'], ['equatorial', 'equatorial']] } },
  eyepiece: { label: 'Eyepiece', fields: [['focal_mm', 'Focal length (mm)', 1, 100, true], ['afov_deg', 'Apparent field (°)', 20, 120, true], ['field_stop_mm', 'Field stop (mm, optional)', 1, 80, false]] },
  barlow: { label: 'Barlow lens / focal reducer', fields: [['factor', 'Factor (×, below 1 for a reducer)', 0.2, 6, true]] },
  diagonal: { label: 'Diagonal', fields: [], choices: { prism: [['mirror90', '90° mirror diagonal'], ['prism90', '90° prism diagonal'], ['erecting_roof45', '45° erecting prism'], ['erecting_roof90', '90° erecting prism']] } },
  camera: { label: 'Camera', fields: [['width_px', 'Width (pixels)', 16, 20000, true], ['height_px', 'Height (pixels)', 16, 20000, true], ['pixel_um', 'Pixel size (µm)', 0.5, 30, true]] },
  binocular: { label: 'Binoculars', fields: [['aperture_mm', 'Aperture (mm)', 10, 200, true], ['magnification', 'Magnification (×)', 1, 100, true], ['tfov_deg', 'True field (°)', 0.5, 20, true]] },
};

// Generic presets (no brands): common sizes of the trade.
export const PRESETS = [
  { kind: 'telescope', name: '80/600 refractor', aperture_mm: 80, focal_mm: 600, design: 'refractor', mount: 'alt_az' },
  { kind: 'telescope', name: '102/1300 Maksutov', aperture_mm: 102, focal_mm: 1300, design: 'maksutov_cassegrain', mount: 'alt_az' },
  { kind: 'telescope', name: '130/650 Newtonian on an equatorial mount', aperture_mm: 130, focal_mm: 650, design: 'newtonian', mount: 'equatorial' },
  { kind: 'telescope', name: '200/1200 Newtonian on a rocker mount', aperture_mm: 200, focal_mm: 1200, design: 'newtonian', mount: 'dobsonian' },
  { kind: 'telescope', name: '203/2032 Schmidt-Cassegrain', aperture_mm: 203, focal_mm: 2032, design: 'schmidt_cassegrain', mount: 'alt_az' },
  { kind: 'eyepiece', name: '32 mm 50°', focal_mm: 32, afov_deg: 50 },
  { kind: 'eyepiece', name: '25 mm 52°', focal_mm: 25, afov_deg: 52 },
  { kind: 'eyepiece', name: '15 mm 60°', focal_mm: 15, afov_deg: 60 },
  { kind: 'eyepiece', name: '10 mm 52°', focal_mm: 10, afov_deg: 52 },
  { kind: 'eyepiece', name: '6 mm 60°', focal_mm: 6, afov_deg: 60 },
  { kind: 'barlow', name: '2× Barlow lens', factor: 2 },
  { kind: 'barlow', name: '0.63× focal reducer', factor: 0.63 },
  { kind: 'diagonal', name: '90° mirror diagonal', prism: 'mirror90' },
  { kind: 'diagonal', name: '45° erecting prism', prism: 'erecting_roof45' },
  { kind: 'camera', name: 'small-sensor camera, 1920×1080, 2.9 µm', width_px: 1920, height_px: 1080, pixel_um: 2.9 },
  { kind: 'binocular', name: '10×50 binoculars', aperture_mm: 50, magnification: 10, tfov_deg: 6.5 },
];

let idCounter = 0;
export function newId(kind) {
  idCounter += 1;
  return `${kind.slice(0, 3)}-${Date.now().toString(36)}-${idCounter.toString(36)}`;
}

export function itemFromPreset(p) {
  const item = { ...p, id: newId(p.kind) };
  return item;
}

// Invented demo kit for an invented club ("Hollow Meadow Sky Circle").
export function demoKit() {
  const items = [
    { id: 'tel-a', kind: 'telescope', name: '200/1200 Newtonian on a rocker mount', aperture_mm: 200, focal_mm: 1200, design: 'newtonian', mount: 'dobsonian' },
    { id: 'tel-b', kind: 'telescope', name: '80/600 refractor', aperture_mm: 80, focal_mm: 600, design: 'refractor', mount: 'alt_az' },
    { id: 'ep-32', kind: 'eyepiece', name: '32 mm 50°', focal_mm: 32, afov_deg: 50 },
    { id: 'ep-25', kind: 'eyepiece', name: '25 mm 52°', focal_mm: 25, afov_deg: 52 },
    { id: 'ep-10', kind: 'eyepiece', name: '10 mm 52°', focal_mm: 10, afov_deg: 52 },
    { id: 'ep-6', kind: 'eyepiece', name: '6 mm 60°', focal_mm: 6, afov_deg: 60 },
    { id: 'dia-m', kind: 'diagonal', name: '90° mirror diagonal', prism: 'mirror90' },
    { id: 'bar-2', kind: 'barlow', name: '2× Barlow lens', factor: 2 },
    { id: 'bin-1', kind: 'binocular', name: '10×50 binoculars', aperture_mm: 50, magnification: 10, tfov_deg: 6.5 },
  ];
  const stations = [
    { id: 'st-1', name: 'Station 1 — big reflector', telescope: 'tel-a', diagonal: null, barlow: null, camera: null, eyepieces: ['ep-32', 'ep-25', 'ep-10', 'ep-6'] },
    { id: 'st-2', name: 'Station 2 — small refractor', telescope: 'tel-b', diagonal: 'dia-m', barlow: null, camera: null, eyepieces: ['ep-25', 'ep-10'] },
  ];
  return { schema: KIT_SCHEMA, owner: 'Hollow Meadow Sky Circle (demo)', items, stations };
}

export class KitError extends Error {}

const num = (v) => (typeof v === 'number' && Number.isFinite(v));

// Validate a kit (current schema) and return a clean copy, or throw KitError in plain words.
export function validateKit(k) {
  if (!k || typeof k !== 'object' || Array.isArray(k)) throw new KitError('The kit is not an object with "items" and "stations".');
  if (!Array.isArray(k.items)) throw new KitError('The kit has no "items" list.');
  if (!Array.isArray(k.stations)) throw new KitError('The kit has no "stations" list.');
  if (k.items.length > 500) throw new KitError(`The kit has ${k.items.length} items; at most 500 are allowed.`);
  const ids = new Set();
  const items = k.items.map((it, i) => {
    const where = `Item ${i + 1}${it && typeof it.name === 'string' ? ` ("${it.name}")` : ''}`;
    if (!it || typeof it !== 'object') throw new KitError(`${where} is not an object.`);
    const def = KINDS[it.kind];
    if (!def) throw new KitError(`${where} has kind "${it.kind}"; allowed: ${Object.keys(KINDS).join(', ')}.`);
    if (typeof it.id !== 'string' || !it.id || it.id.length > 64) throw new KitError(`${where} has no valid "id" (text, 1 to 64 characters).`);
    if (ids.has(it.id)) throw new KitError(`${where} repeats the id "${it.id}".`);
    ids.add(it.id);
    const out = { id: it.id, kind: it.kind, name: typeof it.name === 'string' ? it.name.slice(0, 80) : def.label };
    for (const [key, label, min, max, required] of def.fields) {
      const v = it[key];
      if (v === undefined || v === null || v === '') {
        if (required) throw new KitError(`${where}: "${label}" is missing (allowed ${min} to ${max}).`);
        continue;
      }
      if (!num(v) || v < min || v > max) throw new KitError(`${where}: "${label}" is ${JSON.stringify(v)}; allowed ${min} to ${max}.`);
      out[key] = v;
    }
    for (const [key, options] of Object.entries(def.choices || {})) {
      const allowed = options.map((o) => o[0]);
      const v = it[key] ?? allowed[0];
      if (!allowed.includes(v)) throw new KitError(`${where}: "${key}" is "${v}"; allowed: ${allowed.join(', ')}.`);
      out[key] = v;
    }
    return out;
  });
  const byId = new Map(items.map((it) => [it.id, it]));
  const ref = (where, id, kind) => {
    if (id === null || id === undefined) return null;
    const it = byId.get(id);
    if (!it || it.kind !== kind) throw new KitError(`${where} refers to a ${kind} "${id}" that is not in the kit.`);
    return id;
  };
  const stations = k.stations.map((s, i) => {
    const where = `Station ${i + 1}${s && typeof s.name === 'string' ? ` ("${s.name}")` : ''}`;
    if (!s || typeof s !== 'object') throw new KitError(`${where} is not an object.`);
    const binocular = ref(where, s.binocular ?? null, 'binocular');
    const telescope = ref(where, s.telescope ?? null, 'telescope');
    if (!telescope && !binocular) throw new KitError(`${where} has neither a telescope nor binoculars.`);
    const eyepieces = Array.isArray(s.eyepieces) ? s.eyepieces.map((e) => ref(where, e, 'eyepiece')) : [];
    return {
      id: typeof s.id === 'string' && s.id ? s.id.slice(0, 64) : newId('station'),
      name: typeof s.name === 'string' ? s.name.slice(0, 80) : `Station ${i + 1}`,
      telescope, binocular, eyepieces,
      diagonal: ref(where, s.diagonal ?? null, 'diagonal'),
      barlow: ref(where, s.barlow ?? null, 'barlow'),
      camera: ref(where, s.camera ?? null, 'camera'),
    };
  });
  return { schema: KIT_SCHEMA, owner: typeof k.owner === 'string' ? k.owner.slice(0, 80) : '', items, stations };
}

// Bring any known older schema up to the current one. Throws KitError for unknown ones.
export function migrate(raw) {
  if (!raw || typeof raw !== 'object') throw new KitError('The kit file is empty or not a kit.');
  const schema = raw.schema ?? raw.version;
  if (schema === KIT_SCHEMA) return validateKit(raw);
  if (schema === 1) {
    // v1: {version:1, telescopes:[...], eyepieces:[...], accessories:[...]} with one implicit station.
    const items = [];
    for (const t of raw.telescopes || []) items.push({ ...t, kind: 'telescope', id: t.id || newId('telescope') });
    for (const e of raw.eyepieces || []) items.push({ ...e, kind: 'eyepiece', id: e.id || newId('eyepiece') });
    for (const a of raw.accessories || []) items.push({ ...a, id: a.id || newId(a.kind || 'acc') });
    const tel = items.find((i) => i.kind === 'telescope');
    const stations = tel ? [{ id: 'st-1', name: 'Station 1', telescope: tel.id, eyepieces: items.filter((i) => i.kind === 'eyepiece').map((i) => i.id) }] : [];
    return validateKit({ schema: KIT_SCHEMA, items, stations, owner: raw.owner });
  }
  if (typeof schema === 'number' && schema > KIT_SCHEMA) {
    throw new KitError(`This kit was saved by a newer Nightfield (kit schema ${schema}; this app reads up to ${KIT_SCHEMA}). Update the app first.`);
  }
  throw new KitError(`Unknown kit schema ${JSON.stringify(schema)} (allowed: 1 to ${KIT_SCHEMA}).`);
}

// Load the saved kit; the demo kit if none. Never throws; reports a problem in `problem`.
export function loadKit(storage = localStorage) {
  let text = null;
  try { text = storage.getItem(KIT_KEY); } catch (e) { return { kit: demoKit(), problem: 'This browser blocks storage; the kit cannot be saved here.' }; }
  if (text === null) return { kit: demoKit(), problem: null, fresh: true };
  try {
    const raw = JSON.parse(text);
    const kit = migrate(raw);
    if ((raw.schema ?? raw.version) !== KIT_SCHEMA) {
      storage.setItem(`${KIT_KEY}.v${raw.schema ?? raw.version}`, text); // keep the old copy
      saveKit(kit, storage);
    }
    return { kit, problem: null };
  } catch (e) {
    // Keep the unreadable text; do not overwrite it with the demo.
    try { storage.setItem(BACKUP_KEY, text); } catch (e2) { /* full */ }
    return { kit: demoKit(), problem: `The saved kit could not be read (${e.message}); a copy was kept, and the demo kit is shown until you save.`, readOnly: true };
  }
}

export function saveKit(kit, storage = localStorage) {
  const clean = validateKit(kit);
  storage.setItem(KIT_KEY, JSON.stringify(clean));
  return clean;
}

export function exportKitText(kit) {
  return JSON.stringify({ format: FILE_FORMAT, ...validateKit(kit) }, null, 2);
}

// Parse an imported kit file; throws KitError with a plain message.
export function importKitText(text) {
  if (text.length > 1_000_000) throw new KitError('The file is larger than 1 MB; a kit file is much smaller.');
  let raw;
  try { raw = JSON.parse(text); } catch (e) { throw new KitError(`The file is not a kit file: it is not valid JSON (${e.message}).`); }
  if (raw && raw.format !== undefined && raw.format !== FILE_FORMAT) throw new KitError(`The file says it is "${raw.format}", not a Nightfield kit file.`);
  return migrate(raw);
}

export const itemsOf = (kit, kind) => kit.items.filter((i) => i.kind === kind);
export const itemById = (kit, id) => kit.items.find((i) => i.id === id) || null;

// Remove an item and every station reference to it.
export function removeItem(kit, id) {
  const items = kit.items.filter((i) => i.id !== id);
  const stations = kit.stations
    .map((s) => ({ ...s, eyepieces: s.eyepieces.filter((e) => e !== id),
      diagonal: s.diagonal === id ? null : s.diagonal, barlow: s.barlow === id ? null : s.barlow,
      camera: s.camera === id ? null : s.camera, telescope: s.telescope === id ? null : s.telescope,
      binocular: s.binocular === id ? null : s.binocular }))
    .filter((s) => s.telescope || s.binocular);
  return { ...kit, items, stations };
}

export function choiceLabel(kind, key, value) {
  const o = (KINDS[kind].choices?.[key] || []).find((c) => c[0] === value);
  return o ? o[1] : String(value);
}

export function describeItem(it) {
  switch (it.kind) {
    case 'telescope': return `${it.aperture_mm} mm, f = ${it.focal_mm} mm (f/${(it.focal_mm / it.aperture_mm).toFixed(1)}), ${choiceLabel('telescope', 'design', it.design)}, ${choiceLabel('telescope', 'mount', it.mount)}`;
    case 'eyepiece': return `${it.focal_mm} mm, ${it.afov_deg}° apparent${it.field_stop_mm ? `, field stop ${it.field_stop_mm} mm` : ''}`;
    case 'barlow': return `${it.factor}× ${it.factor < 1 ? 'focal reducer' : 'Barlow lens'}`;
    case 'diagonal': return choiceLabel('diagonal', 'prism', it.prism);
    case 'camera': return `${it.width_px}×${it.height_px} px, ${it.pixel_um} µm`;
    case 'binocular': return `${it.magnification}×${it.aperture_mm}, ${it.tfov_deg}° field`;
    default: return '';
  }
}
