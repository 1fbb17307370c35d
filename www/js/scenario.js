// The page state <-> the engine's Scenario JSON (src/scenario.rs is the authority on its shape).
// All mapping lives here so the rest of the page does not depend on the field names.

import { isValidZone, isoUtc } from './time.js';
import { validateKit } from './kit.js';

/** Demo site: an invented field of an invented club. */
export function demoSite() {
  return { name: 'Hollow Meadow field (demo)', lat_deg: 47.05, lon_deg: 8.3, elev_m: 560, tz: 'Europe/Zurich', event_start: '19:00', event_end: '23:00' };
}

/** The optics train (src/optics/train.rs JSON) of a station with its n-th eyepiece. */
export function trainFor(kit, station, eyepieceIndex) {
  const get = (id) => (id ? kit.items.find((i) => i.id === id) : null);
  const bin = get(station.binocular);
  if (bin) {
    return { name: station.name, instrument: { kind: 'binoculars', aperture_mm: bin.aperture_mm, magnification: bin.magnification, true_field_deg: bin.tfov_deg },
      accessories: [], mount: { kind: 'alt_az' } };
  }
  const tel = get(station.telescope);
  const design = { type: tel.design };
  if (tel.design === 'newtonian') design.focuser_angle_deg = 0;
  const acc = [];
  const dia = get(station.diagonal);
  if (dia) acc.push({ kind: 'star_diagonal', prism: dia.prism, rotation_deg: 0 });
  const bar = get(station.barlow);
  if (bar) acc.push({ kind: bar.factor < 1 ? 'reducer' : 'barlow', factor: bar.factor });
  const cam = get(station.camera);
  const ep = get(station.eyepieces[eyepieceIndex]);
  if (ep) {
    const e = { kind: 'eyepiece', focal_length_mm: ep.focal_mm, apparent_field_deg: ep.afov_deg };
    if (ep.field_stop_mm) e.field_stop_mm = ep.field_stop_mm;
    acc.push(e);
  } else if (cam) {
    acc.push({ kind: 'camera', sensor_width_mm: cam.width_px * cam.pixel_um / 1000, sensor_height_mm: cam.height_px * cam.pixel_um / 1000,
      pixel_pitch_um: cam.pixel_um, pixels_x: cam.width_px, pixels_y: cam.height_px });
  }
  return { name: station.name, instrument: { kind: 'telescope', design, aperture_mm: tel.aperture_mm, focal_length_mm: tel.focal_mm },
    accessories: acc, mount: tel.mount === 'equatorial' ? { kind: 'equatorial', pier_side: 'west' } : { kind: 'alt_az' } };
}

/** Target as the engine's TargetSpec: a name (string) the search resolves, or ICRS coordinates. */
export function targetSpec(t) {
  if (t && typeof t === 'object' && Number.isFinite(t.ra_deg) && Number.isFinite(t.dec_deg)) return { ra_deg: +t.ra_deg, dec_deg: +t.dec_deg };
  if (t && typeof t === 'object' && typeof t.name === 'string') return t.name;
  return String(t || '');
}

export function targetLabel(t) {
  const s = targetSpec(t);
  return typeof s === 'string' ? s : `RA ${s.ra_deg.toFixed(3)}°, Dec ${s.dec_deg.toFixed(3)}°`;
}

/** Every station's trains, one per eyepiece (or one if it has none), for the night plan.
 *  Each train is named after its eyepiece (and Barlow lens): the plan's cards say which to use. */
export function stationSpecs(kit) {
  const get = (id) => (id ? kit.items.find((i) => i.id === id) : null);
  return kit.stations.map((st) => ({
    name: st.name,
    trains: (st.eyepieces.length ? st.eyepieces : [null]).map((epId, i) => {
      const t = trainFor(kit, st, i);
      const ep = get(epId);
      const bar = get(st.barlow);
      if (ep) t.name = `${ep.name} eyepiece${bar ? ` + ${bar.name}` : ''}`;
      else t.name = (get(st.binocular) || get(st.camera) || get(st.telescope))?.name || st.name;
      return t;
    }),
  }));
}

export function toScenario(state, overrides = {}) {
  const s = { ...state, ...overrides };
  const stationIndex = Math.max(0, s.kit.stations.findIndex((st) => st.id === s.stationId));
  const station = s.kit.stations[stationIndex];
  return {
    version: 1,
    site: { name: s.site.name, lat_deg: s.site.lat_deg, lon_deg: s.site.lon_deg, elev_m: s.site.elev_m, tz: s.site.tz,
      event_start: s.site.event_start || '', event_end: s.site.event_end || '' },
    time_utc: isoUtc(s.utc_ms),
    kit: s.kit,
    station: stationIndex,
    eyepiece: s.eyepieceIndex,
    train: station ? trainFor(s.kit, station, s.eyepieceIndex) : null,
    stations: stationSpecs(s.kit),
    target: targetSpec(s.target),
    view: { north_up: !!s.view.north_up, night: !!s.view.night, labels: s.view.labels !== false, compare: !!s.view.compare },
  };
}

/** Page state from a Scenario (e.g. decoded from a link). Throws with a plain message. */
export function fromScenario(sc) {
  if (!sc || typeof sc !== 'object') throw new Error('The link holds no scenario.');
  const kit = validateKit(sc.kit);
  const site = sc.site || {};
  for (const [k, lo, hi] of [['lat_deg', -90, 90], ['lon_deg', -180, 180]]) {
    if (typeof site[k] !== 'number' || site[k] < lo || site[k] > hi) throw new Error(`The link's site ${k} is ${site[k]}; allowed ${lo} to ${hi}.`);
  }
  const tz = isValidZone(site.tz) ? site.tz : 'UTC';
  // The instant is UTC, so a link opened in another zone keeps the site's times.
  const utc_ms = Date.parse(String(sc.time_utc || ''));
  if (!Number.isFinite(utc_ms)) throw new Error(`The link's time "${sc.time_utc}" is not a date and time.`);
  const st = kit.stations[sc.station | 0] || kit.stations[0];
  return {
    kit,
    site: { name: String(site.name || ''), lat_deg: site.lat_deg, lon_deg: site.lon_deg, elev_m: +site.elev_m || 0, tz,
      event_start: site.event_start || '', event_end: site.event_end || '' },
    utc_ms,
    stationId: st ? st.id : null,
    eyepieceIndex: sc.eyepiece | 0,
    target: targetSpec(sc.target),
    view: { north_up: !!sc.view?.north_up, night: !!sc.view?.night, labels: sc.view?.labels !== false, compare: !!sc.view?.compare },
  };
}
