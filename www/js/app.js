// Nightfield page: state, wiring of panels, engine calls, share links and offline.
import { EngineHost } from './engine-host.js';
import { loadKit, saveKit, KitError } from './kit.js';
import { initKitUi, renderKit } from './kit-ui.js';
import { initSiteUi, renderSite } from './site-ui.js';
import { toScenario, fromScenario, demoSite, targetSpec, targetLabel } from './scenario.js';
import { renderFigures, solarCaution } from './figures.js';
import { paint, attachGestures } from './view.js';
import { encodeQr, drawQr } from './qr.js';
import { loadTiers, showTiers, registerWorker, askPersist } from './offline.js';
import { zonedToUtcMs, utcToZoned, isValidZone, siteLabel } from './time.js';
import { initPlanUi } from './plan-ui.js';
import { tonightRequest, tonightKey, tonightRows, rowWords, GROUPS, COMPACT_ROWS, WINDOW_HOURS } from './tonight.js';

const $ = (id) => document.getElementById(id);
const SESSION_KEY = 'nightfield.session';
const NIGHT_KEY = 'nightfield.night';

const app = {
  state: null,
  kitSource: 'saved',      // 'link' while a shared link's kit is shown and not adopted
  savedKit: null,
  figures: null,
  host: null,
  painted: false,

  showError(msg) {
    const a = $('alert');
    a.textContent = msg;
    a.hidden = false;
  },
  clearError() { $('alert').hidden = true; $('alert').textContent = ''; },
  note(id, msg) { $(id).textContent = msg; },

  refreshKitNote() {
    let last = null;
    try { last = +localStorage.getItem('nightfield.exported') || null; } catch (e) { /* ignore */ }
    const ago = last ? `last exported ${new Date(last).toLocaleDateString()}` : 'never exported';
    $('kit-note').textContent = this.kitSource === 'link'
      ? 'You are looking at the kit from a shared link. Changes here are not saved; your own kit is kept as it was.'
      : `Saved on this device (${this.state.kit.items.length} items, ${ago}). Export it now and then to keep a copy.`;
  },

  /** Apply fn to the kit, validate, save (unless it is a link's kit), re-render. Returns success. */
  updateKit(fn) {
    let next;
    try {
      next = fn(this.state.kit);
      if (this.kitSource === 'saved') next = saveKit(next);
    } catch (e) {
      this.showError(e instanceof KitError ? `Not saved: ${e.message}` : `Not saved: the kit could not be stored (${e.message}).`);
      return false;
    }
    this.state.kit = next;
    if (this.kitSource === 'saved') this.savedKit = next;
    if (!next.stations.some((s) => s.id === this.state.stationId)) this.state.stationId = next.stations[0]?.id || null;
    renderKit(this);
    this.apply();
    return true;
  },
  updateSite(site, utcMs) {
    this.state.site = site;
    if (utcMs !== undefined) this.state.utc_ms = utcMs;
    this.apply();
  },
  updateTime(utcMs) { this.state.utc_ms = utcMs; this.apply(); },
  chooseStation(id) { this.state.stationId = id; this.state.eyepieceIndex = 0; renderKit(this); this.apply(); },

  station() { return this.state.kit.stations.find((s) => s.id === this.state.stationId) || this.state.kit.stations[0] || null; },

  stepEyepiece(d) {
    const st = this.station();
    const n = st ? st.eyepieces.length : 0;
    if (n < 2) return;
    // Order by focal length so "+" is always more power.
    const sorted = sortedEyepieces(this.state.kit, st);
    const cur = sorted.indexOf(st.eyepieces[this.state.eyepieceIndex]);
    const nextPos = Math.min(n - 1, Math.max(0, cur + d));
    this.state.eyepieceIndex = st.eyepieces.indexOf(sorted[nextPos]);
    this.apply();
  },

  saveSession() {
    if (this.kitSource !== 'saved') return;
    const s = this.state;
    try {
      localStorage.setItem(SESSION_KEY, JSON.stringify({ v: 1, site: s.site, utc_ms: s.utc_ms, stationId: s.stationId,
        eyepieceIndex: s.eyepieceIndex, target: s.target, view: s.view }));
    } catch (e) { /* storage full or blocked: the session is a convenience */ }
  },

  /** Push the scenario to the engine and repaint everything that depends on it. */
  apply() {
    if (!this.host || !this.host.engine) return;
    const st = this.station();
    if (!st) { this.showError('The kit has no station. Add a telescope or binoculars (Kit → Add) to see a view.'); return; }
    if (this.state.eyepieceIndex >= st.eyepieces.length) this.state.eyepieceIndex = 0;
    this.state.view.night = document.documentElement.dataset.night === '1';
    const sc = toScenario(this.state);
    try {
      this.figures = this.host.call((e) => e.setScenario(sc));
    } catch (e) {
      this.showError(e.message || String(e));
      return;
    }
    renderFigures($('figures'), this.figures, $('view-notes'));
    const caution = solarCaution(this.figures, targetLabel(this.state.target));
    $('solar-caution').hidden = !caution;
    const title = document.createElement('strong');
    if (caution) title.textContent = caution.title;
    $('solar-caution').replaceChildren(...(caution ? [title, caution.text] : []));
    this.paintAll();
    const ep = this.currentEyepiece();
    $('print-summary').textContent = `${this.state.site.name} · ${siteLabel(this.state.utc_ms, this.state.site.tz)} · ${st.name}${ep ? ` · ${ep.name}` : ''} · ${targetLabel(this.state.target)}`;
    renderSite(this);
    this.saveSession();
    if (!$('panel-share').hidden) this.renderShare();
    if (!$('panel-target').hidden) this.renderTonight();
  },

  paintAll() {
    const night = document.documentElement.dataset.night === '1';
    try {
      const info = paint(this.host, null, $('view'), night, this.state.view.labels !== false);
      const ep = this.currentEyepiece();
      const when = utcToZoned(this.state.utc_ms, this.state.site.tz).time;
      const main = document.createElement('span');
      main.textContent = `${this.station()?.name || ''}${ep ? ` · ${ep.name}` : ''} · at ${when}`;
      const drift = document.createElement('span');
      drift.className = 'drift';
      // The drift words sit here rather than on the drawing, where they crossed stars and the rim.
      if (info.drift) drift.textContent = `Without a drive the target ${info.drift.replace(/^leaves field/, 'leaves the field')} (arrow at the edge).`;
      $('view-caption').replaceChildren(main, drift);
      if (this.state.view.compare) this.paintCompare(night);
    } catch (e) {
      this.showError(e.message || String(e));
      return;
    }
    if (!this.painted) {
      this.painted = true;
      performance.mark('nf:first-paint');
      document.documentElement.dataset.ready = '1';
    }
  },

  currentEyepiece() {
    const st = this.station();
    const id = st && st.eyepieces[this.state.eyepieceIndex];
    return id ? this.state.kit.items.find((i) => i.id === id) : null;
  },

  /** Compare: the next eyepiece up at the same station, or the next station if it has one only. */
  paintCompare(night) {
    const st = this.station();
    let over;
    if (st.eyepieces.length > 1) {
      const sorted = sortedEyepieces(this.state.kit, st);
      const pos = sorted.indexOf(st.eyepieces[this.state.eyepieceIndex]);
      const other = sorted[pos + 1 < sorted.length ? pos + 1 : pos - 1];
      over = { eyepieceIndex: st.eyepieces.indexOf(other) };
    } else {
      const i = this.state.kit.stations.indexOf(st);
      const other = this.state.kit.stations[(i + 1) % this.state.kit.stations.length];
      over = { stationId: other.id, eyepieceIndex: 0 };
    }
    const eng2 = this.host.secondary('compare');
    const sc = toScenario(this.state, over);
    const f2 = this.host.call((e) => e.setScenario(sc), eng2);
    // Same angular scale as the main view: the engine fits each field to its canvas, so zoom the
    // second by the ratio of true fields (zoom steps are 2^(step/4)).
    const tf1 = this.figures?.true_field_deg, tf2 = f2?.true_field_deg;
    if (tf1 > 0 && tf2 > 0 && Math.abs(tf2 / tf1 - 1) > 1e-9) this.host.call((e) => e.zoom(4 * Math.log2(tf2 / tf1)), eng2);
    paint(this.host, eng2, $('view2'), night, this.state.view.labels !== false);
    const s2 = this.state.kit.stations.find((s) => s.id === (over.stationId || st.id));
    const ep2 = this.state.kit.items.find((i) => i.id === s2.eyepieces[over.eyepieceIndex]);
    $('view2-caption').textContent = `${s2.name}${ep2 ? ` · ${ep2.name}` : ''} (same scale)`;
  },

  linkFor() {
    // The page rebuilds the trains from the kit, so the link leaves them out (a shorter QR code).
    // It also carries only the chosen station and its equipment: all the view needs.
    const st = this.station();
    const used = new Set([st.telescope, st.binocular, st.diagonal, st.barlow, st.camera, ...st.eyepieces].filter(Boolean));
    const kit = { ...this.state.kit, items: this.state.kit.items.filter((i) => used.has(i.id)), stations: [st] };
    const full = toScenario({ ...this.state, kit });
    let payload;
    try { payload = this.host.call((e) => e.encodeLink({ ...full, train: null, stations: [] })); } catch (err) {
      if (err.engineDied) throw err;
      payload = this.host.call((e) => e.encodeLink(full));
    }
    const u = new URL(location.href);
    u.hash = `s=${payload}`;
    u.search = '';
    return u.href;
  },

  renderShare() {
    let link;
    try { link = this.linkFor(); } catch (e) { this.showError(e.message); return; }
    $('share-link').value = link;
    const canvas = $('qr');
    try {
      const qr = encodeQr(link, link.length > 400 ? 'L' : 'M');
      const night = document.documentElement.dataset.night === '1';
      // Night mode keeps red only, but in the usual polarity (dark modules on light): a
      // camera reads that more surely than red modules on black.
      drawQr(canvas.getContext('2d'), qr, 600, '#000', night ? '#ff2a1a' : '#fff');
      $('share-note').textContent = `Link: ${link.length} characters; QR code version ${qr.version}. Scan it with another phone's camera.`;
    } catch (e) {
      $('share-note').textContent = `The link is too long for a QR code (${e.message}); copy it instead.`;
    }
  },

  /** "Up tonight": the engine's night plan from this time for four hours (cached per site,
   *  time and stations), ordered by tonight.js; catalogue magnitudes from the engine's resolve. */
  tonightList() {
    const req = tonightRequest(this.state);
    const key = `${this.host.catalogs.length} ${tonightKey(req)}`;
    if (this.tonight && this.tonight.key === key) return this.tonight;
    const plan = this.host.call((e) => e.planNight(req));
    const magOf = (id) => {
      try { return this.host.call((e) => e.resolve(id))?.vmag ?? null; } catch (err) {
        if (err.engineDied) throw err;
        return null;
      }
    };
    this.tonight = { key, plan, rows: tonightRows(plan, magOf), shown: COMPACT_ROWS };
    return this.tonight;
  },

  renderTonight() {
    const list = $('tonight');
    let t;
    try { t = this.tonightList(); } catch (e) {
      list.replaceChildren(li(`The list could not be made: ${e.message}`));
      $('tonight-more').hidden = true;
      return;
    }
    const from = utcToZoned(this.state.utc_ms, this.state.site.tz).time;
    $('tonight-note').textContent = `From ${from} (site clock) for the next ${WINDOW_HOURS} hours. Tap one to show it.`;
    if (!t.rows.length) {
      list.replaceChildren(li(`Nothing the kit shows well is up between ${from} and ${WINDOW_HOURS} hours later. Change the time under Site & time.`));
      $('tonight-more').hidden = true;
      return;
    }
    const nodes = [];
    let group = null;
    for (const r of t.rows.slice(0, t.shown)) {
      if (r.group !== group) {
        group = r.group;
        const h = li(GROUPS.find(([id]) => id === group)?.[1] || '');
        h.className = 'group';
        nodes.push(h);
      }
      const b = document.createElement('button');
      b.type = 'button'; b.className = 'pick';
      b.textContent = r.name;
      const sub = document.createElement('span'); sub.className = 'sub';
      sub.textContent = rowWords(r);
      b.append(sub);
      b.addEventListener('click', () => {
        // On a phone the view is far above the list: bring it back into sight.
        if (this.setTarget(r.query) && $('view').getBoundingClientRect().top < 0) window.scrollTo({ top: 0, behavior: 'smooth' });
      });
      const item = document.createElement('li'); item.append(b);
      item.dataset.group = r.group;
      nodes.push(item);
    }
    list.replaceChildren(...nodes);
    const left = t.rows.length - t.shown;
    $('tonight-more').hidden = left <= 0;
    $('tonight-more').textContent = `Show ${Math.min(left, COMPACT_ROWS)} more (${left} left)`;
  },

  setTarget(query) {
    let resolved;
    try { resolved = this.host.call((e) => e.resolve(query)); } catch (e) {
      this.showError(`"${query}" was not found: ${e.message}`);
      return false;
    }
    this.state.target = query;
    $('target-now').textContent = `Showing ${resolved && resolved.name ? resolved.name : query}.`;
    this.apply();
    return true;
  },
};

function li(text) { const e = document.createElement('li'); e.textContent = text; return e; }

function sortedEyepieces(kit, st) {
  const fl = (id) => kit.items.find((i) => i.id === id)?.focal_mm || 0;
  return [...st.eyepieces].sort((a, b) => fl(b) - fl(a));
}

function defaultState(kit) {
  const site = demoSite();
  const today = utcToZoned(Date.now(), site.tz).date;
  return { kit, site, utc_ms: zonedToUtcMs(today, '21:00', site.tz), stationId: kit.stations[0]?.id || null, eyepieceIndex: 0,
    target: 'M 45', view: { north_up: false, compare: false, night: false, labels: true } };
}

function restoreSession(state) {
  let s;
  try { s = JSON.parse(localStorage.getItem(SESSION_KEY) || 'null'); } catch (e) { return state; }
  if (!s || s.v !== 1) return state;
  const site = s.site && typeof s.site.lat_deg === 'number' && isValidZone(s.site.tz) ? s.site : state.site;
  return { ...state, site, utc_ms: Number.isFinite(s.utc_ms) ? s.utc_ms : state.utc_ms,
    stationId: state.kit.stations.some((x) => x.id === s.stationId) ? s.stationId : state.stationId,
    eyepieceIndex: s.eyepieceIndex | 0, target: s.target ? targetSpec(s.target) : state.target,
    view: { ...state.view, ...(s.view || {}) } };
}

function initTabs() {
  const tabs = [...document.querySelectorAll('.tab')];
  for (const t of tabs) {
    t.addEventListener('click', () => {
      for (const o of tabs) {
        const on = o === t;
        o.setAttribute('aria-selected', String(on));
        $(o.getAttribute('aria-controls')).hidden = !on;
      }
      if (t.id === 'tab-share') app.renderShare();
      if (t.id === 'tab-target') app.renderTonight();
      if (t.id === 'tab-offline' && app.tiers) showTiers(app.tiers);
    });
  }
}

function initNight() {
  const btn = $('night-toggle');
  const sync = () => btn.setAttribute('aria-pressed', String(document.documentElement.dataset.night === '1'));
  sync();
  btn.addEventListener('click', () => {
    const on = document.documentElement.dataset.night !== '1';
    document.documentElement.dataset.night = on ? '1' : '0';
    try { localStorage.setItem(NIGHT_KEY, on ? '1' : '0'); } catch (e) { /* blocked */ }
    sync();
    app.apply();
  });
}

function initView() {
  let pending = false;
  attachGestures($('view'), {
    onPan: (dx, dy) => {
      try { app.host.call((e) => e.pan(dx, dy)); } catch (e) { app.showError(e.message); return; }
      if (!pending) { pending = true; requestAnimationFrame(() => { pending = false; app.paintAll(); }); }
    },
    onStep: (d) => app.stepEyepiece(d),
  });
  $('ep-prev').addEventListener('click', () => app.stepEyepiece(-1));
  $('ep-next').addEventListener('click', () => app.stepEyepiece(+1));
  $('recentre').addEventListener('click', () => app.apply());
  const nu = $('north-up'); nu.checked = !!app.state.view.north_up;
  nu.addEventListener('change', () => { app.state.view.north_up = nu.checked; app.apply(); });
  const lab = $('labels'); lab.checked = app.state.view.labels !== false;
  lab.addEventListener('change', () => { app.state.view.labels = lab.checked; app.paintAll(); app.saveSession(); });
  const cmp = $('compare'); cmp.checked = !!app.state.view.compare;
  const syncCompare = () => { $('compare-box').hidden = !cmp.checked; $('views').classList.toggle('two', cmp.checked); };
  syncCompare();
  cmp.addEventListener('change', () => { app.state.view.compare = cmp.checked; syncCompare(); app.apply(); });
  $('search-form').addEventListener('submit', (ev) => {
    ev.preventDefault();
    const q = $('search').value.trim();
    if (q && app.setTarget(q)) $('search').blur();
  });
  $('share-copy').addEventListener('click', async () => {
    try { await navigator.clipboard.writeText($('share-link').value); $('share-note').textContent = 'Link copied.'; } catch (e) {
      $('share-link').select(); $('share-note').textContent = 'Copy the selected link by hand (the browser refused the clipboard).';
    }
  });
  $('alert').addEventListener('click', () => app.clearError());
  $('tonight-more').addEventListener('click', () => {
    if (!app.tonight) return;
    app.tonight.shown += COMPACT_ROWS;
    app.renderTonight();
  });
  let resizeT = 0;
  window.addEventListener('resize', () => { clearTimeout(resizeT); resizeT = setTimeout(() => app.painted && app.paintAll(), 150); });
}

/** A #s= link in the address: show its scenario; never replace the saved kit unless asked. */
function openLink() {
  const h = location.hash;
  if (!h.startsWith('#s=')) return;
  let linked;
  try {
    linked = fromScenario(app.host.call((e) => e.decodeLink(h.slice(1))));
  } catch (e) {
    app.showError(`This share link cannot be opened: ${e.message} Your saved kit and settings are unchanged.`);
    return;
  }
  const same = JSON.stringify(linked.kit) === JSON.stringify(app.savedKit);
  app.state = { ...linked, view: { ...app.state.view, ...linked.view } };
  if (!same) {
    app.kitSource = 'link';
    $('link-banner-text').textContent = `You opened a shared view with its own kit (${linked.kit.items.length} items, ${linked.kit.stations.length} stations). Your saved kit is untouched.`;
    $('link-banner').hidden = false;
  }
}

function initLinkBanner() {
  $('link-keep').addEventListener('click', () => {
    app.kitSource = 'saved';
    app.state.kit = app.savedKit;
    app.state.stationId = app.savedKit.stations[0]?.id || null;
    app.state.eyepieceIndex = 0;
    $('link-banner').hidden = true;
    renderKit(app); app.apply();
  });
  $('link-adopt').addEventListener('click', () => {
    if (!window.confirm('Replace your saved kit with the kit from the link? Your current kit will be lost unless you exported it.')) return;
    try { app.savedKit = saveKit(app.state.kit); } catch (e) { app.showError(`Not saved: ${e.message}`); return; }
    app.kitSource = 'saved';
    $('link-banner').hidden = true;
    renderKit(app); app.apply();
  });
}

/** A tier's data files, downloaded side by side (bytes in the listed order). */
function fetchTier(tier) {
  return Promise.all((tier.catalogs || []).map(async (c) => {
    const res = await fetch(new URL(`../${c.file}`, import.meta.url));
    if (!res.ok) throw new Error(`The ${tier.label.toLowerCase()} data (${c.file}) could not be loaded (HTTP ${res.status}).`);
    return new Uint8Array(await res.arrayBuffer());
  }));
}

async function loadCatalogs(tiers) {
  for (const [k, tier] of tiers.tiers.entries()) {
    // A tier's files download together; they are handed to the engine in the listed order.
    const files = await (k === 0 && app.firstTierFiles ? app.firstTierFiles : fetchTier(tier));
    (tier.catalogs || []).forEach((c, i) => app.host.loadCatalog(c.name, files[i]));
    // Paint as soon as the first (bright) tier is in; deeper tiers repaint when they arrive.
    performance.mark(`nf:tier-${tier.id}`);
    app.apply();
    document.documentElement.dataset.tiers = [document.documentElement.dataset.tiers, tier.id].filter(Boolean).join(' ');
  }
  document.documentElement.dataset.allData = '1';
}

async function main() {
  const { kit, problem } = loadKit();
  app.savedKit = kit;
  app.state = restoreSession(defaultState(kit));
  if (problem) app.showError(problem);
  initNight(); initTabs(); initKitUi(app); initSiteUi(app); initPlanUi(app); initView(); initLinkBanner();
  renderKit(app);
  renderSite(app);
  app.host = new EngineHost({
    onRestart: (why) => {
      app.showError(`The sky engine stopped (${why}) and was restarted. Nothing saved was lost.`);
      app.apply();
    },
  });
  try {
    // The data list and the engine load side by side (no need to wait for one to ask for the other).
    performance.mark('nf:wasm-start');
    const tiersP = loadTiers();
    // The first (bright) tier's files download while the engine instantiates.
    app.firstTierFiles = tiersP.then((t) => fetchTier(t.tiers[0]));
    app.firstTierFiles.catch(() => {}); // reported when loadCatalogs awaits it
    [app.tiers] = await Promise.all([tiersP, app.host.start().then(() => performance.mark('nf:wasm-ready'))]);
  } catch (e) {
    const wa = globalThis.WebAssembly;
    const tooOld = !wa || e instanceof wa.CompileError;
    app.showError(tooOld
      ? `This browser is too old for the sky engine (it needs WebAssembly with SIMD: Safari or iOS 16.4 and later, Chrome 91, Firefox 89). Please update the browser. (${e.message})`
      : `The sky engine could not start: ${e.message}`);
    return;
  }
  openLink();
  showTiers(app.tiers).catch(() => {});
  window.addEventListener('hashchange', () => { openLink(); renderKit(app); app.apply(); });
  try { await loadCatalogs(app.tiers); } catch (e) { app.showError(e.message); }
  if (!app.painted) app.apply();
  registerWorker({
    onUpdateReady: (reg) => {
      $('update-banner').hidden = false;
      $('update-apply').onclick = () => { app.updateRequested = true; if (reg.waiting) reg.waiting.postMessage('skip-waiting'); };
    },
    onActivated: () => {
      if (app.updateRequested) { app.updateRequested = false; location.reload(); return; }
      showTiers(app.tiers).catch(() => {});
    },
  }).catch((e) => app.showError(`Offline use is not available: ${e.message}`));
  showTiers(app.tiers).catch(() => {});
  askPersist().catch(() => {});
}

main();
