// The night plan (Plan tab: station cards, timeline, cautions, printable) and the find card
// (Target tab: pointing in words, a star-hop route, dial readings). Text only: the engine computes.
import { toScenario, trainFor } from './scenario.js';
import { paint } from './view.js';
import { zonedToUtcMs, utcToZoned, isoUtc, zoneOffsetMs } from './time.js';

const $ = (id) => document.getElementById(id);
const el = (tag, cls, text) => { const e = document.createElement(tag); if (cls) e.className = cls; if (text !== undefined) e.textContent = text; return e; };

/** The event window in UTC from the site's date (of the chosen time) and its event hours. */
export function eventWindow(state) {
  const tz = state.site.tz;
  const { date } = utcToZoned(state.utc_ms, tz);
  const start = zonedToUtcMs(date, state.site.event_start || '19:00', tz);
  let end = zonedToUtcMs(date, state.site.event_end || '23:00', tz);
  if (end <= start) end += 24 * 3600 * 1000; // the event crosses midnight
  return { start, end, offsetMin: Math.round(zoneOffsetMs(start, tz) / 60000) };
}

export function planRequest(state) {
  const w = eventWindow(state);
  return { scenario: toScenario(state), start_utc: isoUtc(w.start), end_utc: isoUtc(w.end), utc_offset_min: w.offsetMin };
}

/** The eyepiece of a station whose magnification is nearest the card's. */
function eyepieceFor(kit, st, mag) {
  let best = 0, err = Infinity;
  st.eyepieces.forEach((_, i) => {
    const t = trainFor(kit, st, i);
    const F = t.instrument.focal_length_mm;
    const mod = t.accessories.find((a) => a.kind === 'barlow' || a.kind === 'reducer');
    const ep = t.accessories.find((a) => a.kind === 'eyepiece');
    if (!F || !ep) return;
    const m = (F * (mod ? mod.factor : 1)) / ep.focal_length_mm;
    if (Math.abs(m - mag) < err) { err = Math.abs(m - mag); best = i; }
  });
  return best;
}

const jdToMs = (jd) => (jd - 2440587.5) * 86400000;

function renderCard(card, ctx) {
  const box = el('article', 'card');
  box.append(el('h3', null, card.station));
  for (const c of card.cautions || []) box.append(el('p', 'caution', c));
  if (!card.entries || !card.entries.length) box.append(el('p', 'note', 'Nothing scheduled at this station during the event.'));
  for (const e of card.entries || []) {
    const sec = el('section', 'entry');
    sec.append(el('h4', null, `${e.from_local}–${e.to_local}  ${e.target}`));
    const facts = [`${e.train_label}: ${Math.round(e.magnification)}×, field ${e.true_field_deg.toFixed(2)}°`, e.size_words, e.verdict_words, e.orientation_note, e.height_words]
      .filter((x) => x && String(x).trim());
    const ul = el('ul', 'facts');
    for (const f of facts.concat(e.access_notes || [])) ul.append(el('li', null, f));
    sec.append(ul);
    if (ctx) {
      // A small picture of the view at the target's best time, drawn by the engine.
      const canvas = el('canvas', 'cardview');
      canvas.setAttribute('role', 'img');
      canvas.setAttribute('aria-label', `View of ${e.target}`);
      sec.append(canvas);
      ctx.pending.push({ canvas, entry: e });
    }
    if ((e.talking_points || []).length) {
      const tp = el('ul', 'talk');
      for (const t of e.talking_points) tp.append(el('li', null, t));
      sec.append(el('p', 'sub', 'To tell visitors:'), tp);
    }
    for (const ev of e.events || []) sec.append(el('p', 'event', ev));
    box.append(sec);
  }
  return box;
}

export function renderPlan(app) {
  const out = $('plan-out');
  let plan;
  try {
    plan = app.host.call((e) => e.planNight(planRequest(app.state)));
  } catch (e) {
    out.replaceChildren(el('p', 'note', `The plan could not be made: ${e.message}`));
    return;
  }
  const nodes = [];
  for (const c of plan.cautions || []) {
    const p = el('p', 'caution');
    p.append(el('strong', null, c.level === 'danger' ? '⚠ Sun: danger to eyes' : '⚠ Sun nearby'), c.text || String(c.message || ''));
    nodes.push(p);
  }
  const pending = [];
  (plan.cards || []).forEach((card) => nodes.push(renderCard(card, { pending })));
  out.replaceChildren(...nodes);
  fillSafety(plan);
  $('plan-print').hidden = false;
  // Paint the small views once the canvases are laid out.
  const spare = app.host.secondary('cards');
  let k = 0;
  (plan.cards || []).forEach((card, i) => {
    const st = app.state.kit.stations[i];
    for (const e of card.entries || []) {
      const p = pending[k++];
      if (!p || !st) continue;
      const tp = (plan.targets || [])[e.target_index];
      if (!tp) continue;
      try {
        const when = tp.best_utc_jd ? jdToMs(tp.best_utc_jd) : app.state.utc_ms;
        const sc = toScenario(app.state, { stationId: st.id, eyepieceIndex: eyepieceFor(app.state.kit, st, e.magnification), target: tp.id, utc_ms: when });
        app.host.call((eng) => eng.setScenario(sc), spare);
        paint(app.host, spare, p.canvas, document.documentElement.dataset.night === '1', false);
      } catch (err) {
        if (err.engineDied) throw err;
        p.canvas.replaceWith(el('p', 'note', `(no picture: ${err.message})`));
      }
    }
  });
}

/** The safety card (Plan tab, top) from the engine's cautions card of a plan. */
export function fillSafety(plan) {
  const card = plan && plan.cautions_card;
  if (!card || !Array.isArray(card.items)) return;
  $('safety').querySelector('summary').firstChild.textContent = `${card.title || 'Safety on the field'} `;
  $('safety-items').replaceChildren(...card.items.map((i) => el('li', null, i)));
}

export function renderFind(app) {
  const out = $('find-out');
  let card;
  try {
    card = app.host.call((e) => e.findCard());
  } catch (e) {
    out.replaceChildren(el('p', 'note', `No finding aid: ${e.message}`));
    return;
  }
  const nodes = [el('p', null, card.pointing.sentence)];
  if (card.pointing.from_landmark) nodes.push(el('p', null, card.pointing.from_landmark.sentence));
  if (card.route) {
    nodes.push(el('p', 'sub', `Star-hop with an 8×50 finder, ${card.route.hop_count} ${card.route.hop_count === 1 ? 'hop' : 'hops'}; "star 4" is where hop 4 lands:`));
    const ol = el('ol', 'hops');
    for (const leg of card.route.legs) ol.append(el('li', null, leg.sentence));
    nodes.push(ol);
  } else if (card.route_error) {
    nodes.push(el('p', 'note', card.route_error));
  }
  if (card.dials) nodes.push(el('p', null, card.dials.words));
  const canvas = el('canvas', 'finderview');
  canvas.setAttribute('role', 'img');
  canvas.setAttribute('aria-label', 'The finder\'s view: the main telescope\'s field ringed, the star-hop route drawn');
  const cap = el('p', 'sub', 'In the 8×50 finder, as it shows it: the ring is the telescope\'s field, the line is the route.');
  nodes.push(canvas, cap);
  out.replaceChildren(...nodes);
  try {
    const spare = app.host.secondary('finder');
    app.host.call((e) => e.setScenario(toScenario(app.state)), spare);
    const f = app.host.call((e) => e.finderView(), spare);
    if (f.orientation) cap.textContent += ` The finder's view is ${f.orientation}.`;
    paint(app.host, spare, canvas, document.documentElement.dataset.night === '1', false);
  } catch (err) {
    if (err.engineDied) throw err;
    canvas.replaceWith(el('p', 'note', `(no finder picture: ${err.message})`));
  }
}

export function initPlanUi(app) {
  $('plan-go').addEventListener('click', () => renderPlan(app));
  $('plan-print').addEventListener('click', () => {
    document.body.classList.add('print-cards');
    // The safety card prints open, on its own page after the station cards.
    app.safetyWasOpen = $('safety').open;
    $('safety').open = true;
    window.print();
  });
  window.addEventListener('afterprint', () => {
    document.body.classList.remove('print-cards');
    if (app.safetyWasOpen === false) $('safety').open = false;
  });
  $('find-go').addEventListener('click', () => renderFind(app));
  // The safety card is there before any plan is made: the engine's card from the "up tonight" plan.
  $('tab-plan').addEventListener('click', () => {
    if ($('safety-items').children.length) return;
    try { fillSafety(app.tonightList().plan); } catch (e) { /* the event plan fills it too */ }
  });
}
