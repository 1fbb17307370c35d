// "Up tonight" (Target tab): the engine's night plan from the chosen time for four hours,
// ordered for a volunteer: the Moon and planets first, then the deep-sky showpieces by how
// well they show, then what rises later, then the rest. Every altitude, best time, verdict
// and magnitude comes from the engine (planNight, resolve); this file only sorts and words them.
import { toScenario } from './scenario.js';
import { isoUtc, zoneOffsetMs } from './time.js';

export const WINDOW_HOURS = 4;
/** Rows shown before "Show more". */
export const COMPACT_ROWS = 20;
/** Deep-sky objects count as up from this altitude (lower ones sit in haze and behind trees). */
const DSO_UP_DEG = 10;

const VERDICT_RANK = { Easy: 3, Visible: 2, AvertedVision: 1, NotVisible: 0 };
const VERDICT_WORDS = { Easy: 'easy', Visible: 'visible', AvertedVision: 'faint (averted vision)', NotVisible: 'hard to see' };

export const GROUPS = [
  ['bodies', 'Moon and planets'],
  ['showpieces', 'Deep-sky showpieces'],
  ['later', 'Rising later'],
  ['more', 'More deep-sky objects'],
];

/** The plan request: the site and stations of the state, from its time for WINDOW_HOURS. */
export function tonightRequest(state) {
  const start = state.utc_ms;
  return {
    scenario: toScenario(state),
    start_utc: isoUtc(start),
    end_utc: isoUtc(start + WINDOW_HOURS * 3600 * 1000),
    utc_offset_min: Math.round(zoneOffsetMs(start, state.site.tz) / 60000),
  };
}

/** What the list depends on: site, time and stations (not the eyepiece, target or view). */
export function tonightKey(req) {
  const { scenario: s } = req;
  return JSON.stringify([req.start_utc, req.utc_offset_min, s.site, s.stations]);
}

const isBody = (k) => k === 'moon' || k === 'planet' || k === 'sun';
const kindWords = (k) => String(k || '').replace(/-/g, ' ');

/** The best verdict over the stations at the target's best time, and its margin (mag). */
function bestVerdict(t) {
  let best = null;
  for (const v of t.per_station || []) {
    if (!v) continue;
    const r = VERDICT_RANK[v.verdict_at_best] ?? 0;
    const m = Number.isFinite(v.averted_margin_mag) ? v.averted_margin_mag : -99;
    if (!best || r > best.rank || (r === best.rank && m > best.margin)) best = { rank: r, margin: m, verdict: v.verdict_at_best };
  }
  return best || { rank: 0, margin: -99, verdict: null };
}

/**
 * Rows from a plan. `magOf(id)` gives the engine's catalogue V magnitude (or null).
 * Each row: { group, name, query, kind, altNow, bestLocal, bestAlt, verdict, up, note }.
 */
export function tonightRows(plan, magOf = () => null) {
  const rows = [];
  for (const t of plan?.targets || []) {
    if (!t || !t.candidate || !Array.isArray(t.alt_deg) || !t.alt_deg.length) continue;
    const kind = String(t.kind);
    const altNow = t.alt_deg[0];
    const bestAlt = Number.isFinite(t.best_alt_deg) ? t.best_alt_deg : Math.max(...t.alt_deg);
    const v = bestVerdict(t);
    const row = { name: t.name || t.id, query: t.id, kind: kind === 'moon' || kind === 'sun' ? '' : kindWords(kind), altNow, bestLocal: t.best_local || '', bestAlt,
      verdict: v.verdict ? VERDICT_WORDS[v.verdict] : '', note: '' };
    if (isBody(kind)) {
      // The Sun is a candidate only for a station with a solar filter; the Moon and planets when up.
      if (altNow <= 0 && bestAlt < DSO_UP_DEG) continue;
      row.group = 'bodies';
      row.up = altNow > 0;
      // The Sun (if a station can show it), the Moon, then the planets: those up now brightest
      // first (Saturn before Uranus), then those rising later by their best time.
      const mag = kind === 'planet' && row.up ? magOf(t.id) : null;
      row.order = [kind === 'sun' ? 0 : kind === 'moon' ? 1 : 2, row.up ? 0 : 1, row.up ? (Number.isFinite(mag) ? mag : 99) : t.best_utc_jd || 0, -altNow];
      if (kind === 'sun') row.note = 'only through a proper full-aperture solar filter';
      if (kind === 'moon' && plan.moon && plan.moon.words) row.note = plan.moon.words;
      rows.push(row);
      continue;
    }
    const messier = /^M \d/.test(String(t.id));
    const named = row.name !== t.id;
    row.up = altNow >= DSO_UP_DEG;
    if (!row.up && bestAlt < DSO_UP_DEG + 5) continue;
    const mag = magOf(t.id);
    // How well it shows (our ordering, not a measure): the plan's verdict for a visitor
    // (0–3), how bright it is (0–3 from V 8 to V 2: a bright object survives a poor sky and
    // a small telescope), a Messier number or a common name (the sights visitors ask for),
    // less when it is still low now; the verdict's margin breaks ties.
    const brightness = Number.isFinite(mag) ? Math.min(3, Math.max(0, (8 - mag) / 2)) : 0;
    const fame = messier ? 1 : named ? 0.5 : 0;
    const score = v.rank + brightness + fame - (altNow < 20 ? 1 : 0) + Math.min(1, Math.max(0, v.margin)) / 4;
    const showpiece = messier || named || (Number.isFinite(mag) && mag <= 4.5);
    if (row.up) {
      row.group = showpiece ? 'showpieces' : 'more';
      row.order = [-score, -altNow];
    } else if (showpiece) {
      row.group = 'later';
      row.order = [t.best_utc_jd || 0, -score];
    } else continue;
    rows.push(row);
  }
  const g = Object.fromEntries(GROUPS.map(([id], i) => [id, i]));
  rows.sort((a, b) => (g[a.group] - g[b.group]) || cmp(a.order, b.order));
  return rows;
}

function cmp(a, b) {
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    if (a[i] < b[i]) return -1;
    if (a[i] > b[i]) return 1;
  }
  return 0;
}

/** The line under a row's name. */
export function rowWords(r) {
  const bits = [];
  if (r.up) bits.push(`${Math.round(r.altNow)}° up now`);
  else bits.push('rises later');
  if (r.kind) bits.push(r.kind);
  if (r.bestLocal) bits.push(r.up ? `best at ${r.bestLocal}` : `best at ${r.bestLocal}, ${Math.round(r.bestAlt)}° up`);
  if (r.verdict) bits.push(r.verdict);
  if (r.note) bits.push(r.note);
  return bits.join(' · ');
}
