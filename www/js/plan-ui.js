// The night plan (Plan tab: station cards, timeline, cautions, printable) and the find card
// (Target tab: pointing in words, a star-hop route, dial readings). Text only: the engine computes.
import { toScenario } from './scenario.js';
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

function renderCard(card) {
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
  for (const c of plan.cautions || []) nodes.push(el('p', 'caution', c.text || c.message || String(c.words || JSON.stringify(c))));
  for (const card of plan.cards || []) nodes.push(renderCard(card));
  if (plan.cautions_card) {
    const cc = el('article', 'card');
    cc.append(el('h3', null, plan.cautions_card.title));
    const ul = el('ul');
    for (const i of plan.cautions_card.items) ul.append(el('li', null, i));
    cc.append(ul);
    nodes.push(cc);
  }
  out.replaceChildren(...nodes);
  $('plan-print').hidden = false;
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
    nodes.push(el('p', 'sub', `Star-hop with an 8×50 finder (${card.route.hop_count} hops; ${card.route.method}):`));
    const ol = el('ol', 'hops');
    for (const leg of card.route.legs) ol.append(el('li', null, leg.sentence));
    nodes.push(ol);
  } else if (card.route_error) {
    nodes.push(el('p', 'note', card.route_error));
  }
  if (card.dials) nodes.push(el('p', null, card.dials.words));
  out.replaceChildren(...nodes);
}

export function initPlanUi(app) {
  $('plan-go').addEventListener('click', () => renderPlan(app));
  $('plan-print').addEventListener('click', () => {
    document.body.classList.add('print-cards');
    window.print();
  });
  window.addEventListener('afterprint', () => document.body.classList.remove('print-cards'));
  $('find-go').addEventListener('click', () => renderFind(app));
}
