// Offline: service worker registration, per-tier "ready offline" state, update notice, persistence.

const $ = (id) => document.getElementById(id);

export async function loadTiers() {
  const res = await fetch(new URL('../data-tiers.json', import.meta.url));
  if (!res.ok) throw new Error(`The list of data files could not be loaded (HTTP ${res.status}).`);
  return res.json();
}

/** Which tiers are fully in the offline cache (the cache name comes from the worker's version). */
export async function tierStatus(tiers) {
  const out = [];
  if (!('caches' in window)) return tiers.tiers.map((t) => ({ ...t, ready: false }));
  const names = (await caches.keys()).filter((n) => n.startsWith('nightfield-'));
  for (const t of [{ id: 'shell', label: 'App and sky engine', files: tiers.shell }, ...tiers.tiers.map((x) => ({ ...x, files: x.catalogs.map((c) => c.file) }))]) {
    let ready = names.length > 0;
    for (const f of t.files) {
      const url = new URL(f, new URL('../', import.meta.url)).href;
      if (!(await caches.match(url, { ignoreSearch: true }))) { ready = false; break; }
    }
    out.push({ ...t, ready });
  }
  return out;
}

export async function showTiers(tiers) {
  const list = $('tiers');
  const st = await tierStatus(tiers);
  list.replaceChildren(...st.map((t) => {
    const li = document.createElement('li');
    li.dataset.tier = t.id;
    li.dataset.ready = t.ready ? '1' : '0';
    const s = document.createElement('span'); s.className = 'grow'; s.textContent = t.label;
    const sub = document.createElement('span'); sub.className = 'sub'; sub.textContent = t.ready ? 'ready offline ✓' : 'not yet stored for offline use';
    s.append(sub); li.append(s);
    return li;
  }));
  const all = st.every((t) => t.ready);
  const chip = $('offline-chip');
  chip.textContent = all ? 'ready offline' : st[0]?.ready ? 'partly offline' : 'online only';
  chip.classList.toggle('ok', all);
  return st;
}

export function registerWorker({ onUpdateReady, onActivated }) {
  if (!('serviceWorker' in navigator)) return Promise.resolve(null);
  const swUrl = new URL('../sw.js', import.meta.url);
  // controllerchange also fires on the very first install (clients.claim); the page
  // reloads only when the volunteer asked for the update.
  navigator.serviceWorker.addEventListener('controllerchange', () => onActivated(false));
  navigator.serviceWorker.addEventListener('message', (ev) => {
    if (ev.data && ev.data.type === 'precached') onActivated(true);
  });
  return navigator.serviceWorker.register(swUrl, { scope: new URL('../', import.meta.url).pathname }).then((reg) => {
    const watch = (w) => {
      if (!w) return;
      w.addEventListener('statechange', () => {
        if (w.state === 'installed' && navigator.serviceWorker.controller) onUpdateReady(reg);
        if (w.state === 'activated') onActivated(true);
      });
    };
    if (reg.waiting && navigator.serviceWorker.controller) onUpdateReady(reg);
    watch(reg.installing);
    reg.addEventListener('updatefound', () => watch(reg.installing));
    return reg;
  });
}

export async function askPersist() {
  const note = $('persist-note');
  if (!navigator.storage || !navigator.storage.persist) { note.textContent = 'This browser cannot be asked to keep storage; export your kit now and then.'; return false; }
  let kept = await navigator.storage.persisted();
  if (!kept) kept = await navigator.storage.persist();
  note.textContent = kept ? 'The browser has agreed to keep Nightfield\'s storage.' : 'The browser may clear Nightfield\'s storage when space runs low; export your kit now and then.';
  return kept;
}
