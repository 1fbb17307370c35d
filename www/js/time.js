// Site clock: civil date/time in the site's own IANA zone <-> UTC, via the Intl API only.

const fmtCache = new Map();
function partsFormatter(tz) {
  if (!fmtCache.has(tz)) {
    fmtCache.set(tz, new Intl.DateTimeFormat('en-US', {
      timeZone: tz, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit',
      hour: '2-digit', minute: '2-digit', second: '2-digit',
    }));
  }
  return fmtCache.get(tz);
}

export function isValidZone(tz) {
  if (typeof tz !== 'string' || !tz) return false;
  try { partsFormatter(tz); return true; } catch (e) { return false; }
}

export function deviceZone() {
  try { return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC'; } catch (e) { return 'UTC'; }
}

export function allZones() {
  try { return Intl.supportedValuesOf('timeZone'); } catch (e) { return ['UTC']; }
}

function wallParts(utcMs, tz) {
  const p = {};
  for (const { type, value } of partsFormatter(tz).formatToParts(new Date(utcMs))) p[type] = value;
  return { y: +p.year, mo: +p.month, d: +p.day, h: +p.hour, mi: +p.minute, s: +p.second };
}

/** Offset of the zone from UTC at an instant, in ms (wall clock minus UTC). */
export function zoneOffsetMs(utcMs, tz) {
  const w = wallParts(utcMs, tz);
  const asUtc = Date.UTC(w.y, w.mo - 1, w.d, w.h, w.mi, w.s);
  return asUtc - Math.floor(utcMs / 1000) * 1000;
}

/** Wall-clock date 'YYYY-MM-DD' and time 'HH:MM' in zone tz -> UTC ms (two passes for DST edges). */
export function zonedToUtcMs(date, time, tz) {
  const dm = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date || '');
  const tm = /^(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(time || '');
  if (!dm) throw new Error(`Date "${date}" is not a date (expected YYYY-MM-DD).`);
  if (!tm) throw new Error(`Time "${time}" is not a time (expected HH:MM).`);
  const guess = Date.UTC(+dm[1], +dm[2] - 1, +dm[3], +tm[1], +tm[2], +(tm[3] || 0));
  let utc = guess - zoneOffsetMs(guess, tz);
  const off2 = zoneOffsetMs(utc, tz);
  utc = guess - off2;
  return utc;
}

const pad = (n) => String(n).padStart(2, '0');

/** UTC ms -> { date: 'YYYY-MM-DD', time: 'HH:MM' } on the site's wall clock. */
export function utcToZoned(utcMs, tz) {
  const w = wallParts(utcMs, tz);
  return { date: `${w.y}-${pad(w.mo)}-${pad(w.d)}`, time: `${pad(w.h)}:${pad(w.mi)}` };
}

/** A short human label of an instant on the site's clock, with the zone's abbreviation. */
export function siteLabel(utcMs, tz) {
  return new Intl.DateTimeFormat(undefined, {
    timeZone: tz, weekday: 'short', day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZoneName: 'short',
  }).format(new Date(utcMs));
}

/** ISO-8601 UTC text with seconds, e.g. 2026-12-05T20:30:00Z. */
export function isoUtc(utcMs) {
  return new Date(Math.round(utcMs / 1000) * 1000).toISOString().replace('.000Z', 'Z');
}

/** Whole hours from the event start to its end (crossing midnight), as 'HH:00' labels. */
export function eventHours(start, end) {
  const h0 = /^(\d{2}):/.exec(start || '');
  const h1 = /^(\d{2}):/.exec(end || '');
  if (!h0 || !h1) return [];
  const out = [];
  let h = +h0[1];
  const stop = +h1[1];
  for (let k = 0; k < 24; k++) {
    out.push(`${pad(h)}:00`);
    if (h === stop) break;
    h = (h + 1) % 24;
  }
  return out;
}
