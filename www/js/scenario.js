// The page state <-> the engine's Scenario JSON (src/scenario.rs is the authority on its shape).
// All mapping lives here so the rest of the page does not depend on the field names.

import { isoUtc, isValidZone } from './time.js';
import { validateKit } from './kit.js';

/** Demo site: an invented field of an invented club. */
export function demoSite() {
  return { name: 'Hollow Meadow field (demo)', lat_deg: 47.05, lon_deg: 8.3, elev_m: 560, tz: 'Europe/Zurich', event_start: '19:00', event_end: '23:00' };
}

export function toScenario(state, overrides = {}) {
  const s = { ...state, ...overrides };
  const stationIndex = Math.max(0, s.kit.stations.findIndex((st) => st.id === s.stationId));
  return {
    version: 1,
    site: { name: s.site.name, lat_deg: s.site.lat_deg, lon_deg: s.site.lon_deg, elev_m: s.site.elev_m, tz: s.site.tz,
      event_start: s.site.event_start, event_end: s.site.event_end },
    time_utc: isoUtc(s.utc_ms),
    kit: s.kit,
    station: stationIndex,
    eyepiece: s.eyepieceIndex,
    target: s.target,
    view: { north_up: !!s.view.north_up, night: !!s.view.night },
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
  const utc_ms = Date.parse(sc.time_utc);
  if (!Number.isFinite(utc_ms)) throw new Error(`The link's time "${sc.time_utc}" is not a date and time.`);
  const st = kit.stations[sc.station | 0] || kit.stations[0];
  return {
    kit,
    site: { name: String(site.name || ''), lat_deg: site.lat_deg, lon_deg: site.lon_deg, elev_m: +site.elev_m || 0, tz,
      event_start: site.event_start || '', event_end: site.event_end || '' },
    utc_ms,
    stationId: st ? st.id : null,
    eyepieceIndex: sc.eyepiece | 0,
    target: sc.target,
    view: { north_up: !!sc.view?.north_up, night: !!sc.view?.night },
  };
}
