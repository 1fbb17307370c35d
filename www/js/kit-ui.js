// Kit editor: equipment list, item and station forms, presets, export and import.
import { KINDS, PRESETS, itemFromPreset, describeItem, removeItem, itemsOf, newId, exportKitText, importKitText } from './kit.js';

const $ = (id) => document.getElementById(id);
const el = (tag, props = {}, ...kids) => { const e = document.createElement(tag); Object.assign(e, props); e.append(...kids); return e; };

export function initKitUi(app) {
  const preset = $('preset');
  preset.replaceChildren(...PRESETS.map((p, i) => el('option', { value: String(i), textContent: `${KINDS[p.kind].label}: ${p.name}` })));
  $('preset-add').addEventListener('click', () => {
    const p = PRESETS[+preset.value];
    const item = itemFromPreset(p);
    app.updateKit((k) => {
      const kit = { ...k, items: [...k.items, item] };
      // A new telescope or binoculars with no station gets one, so it can be used at once.
      if (item.kind === 'telescope' || item.kind === 'binocular') {
        kit.stations = [...k.stations, { id: newId('station'), name: `Station ${k.stations.length + 1}`, telescope: item.kind === 'telescope' ? item.id : null,
          binocular: item.kind === 'binocular' ? item.id : null, diagonal: null, barlow: null, camera: null,
          eyepieces: item.kind === 'telescope' ? itemsOf(k, 'eyepiece').slice(0, 3).map((e) => e.id) : [] }];
      }
      return kit;
    });
  });
  $('station-add').addEventListener('click', () => {
    const k = app.state.kit;
    const tel = itemsOf(k, 'telescope')[0] || null;
    const bin = tel ? null : itemsOf(k, 'binocular')[0] || null;
    if (!tel && !bin) { app.showError('Add a telescope or binoculars first: a station is built around one.'); return; }
    const st = { id: newId('station'), name: `Station ${k.stations.length + 1}`, telescope: tel && tel.id, binocular: bin && bin.id,
      diagonal: null, barlow: null, camera: null, eyepieces: itemsOf(k, 'eyepiece').map((e) => e.id) };
    app.updateKit((kk) => ({ ...kk, stations: [...kk.stations, st] }));
    editStation(app, st.id);
  });
  $('kit-export').addEventListener('click', () => {
    const blob = new Blob([exportKitText(app.state.kit)], { type: 'application/json' });
    const a = el('a', { href: URL.createObjectURL(blob), download: `nightfield-kit-${new Date().toISOString().slice(0, 10)}.json` });
    document.body.append(a); a.click(); a.remove();
    setTimeout(() => URL.revokeObjectURL(a.href), 5000);
    try { localStorage.setItem('nightfield.exported', String(Date.now())); } catch (e) { /* ignore */ }
    app.refreshKitNote();
  });
  $('kit-import').addEventListener('change', async (ev) => {
    const file = ev.target.files && ev.target.files[0];
    ev.target.value = '';
    if (!file) return;
    try {
      const kit = importKitText(await file.text());
      if (!window.confirm(`Replace your saved kit (${app.state.kit.items.length} items) with the file's kit (${kit.items.length} items)? Export first if unsure.`)) return;
      app.updateKit(() => kit);
      app.note('kit-note', `Imported ${kit.items.length} items and ${kit.stations.length} stations from "${file.name}".`);
    } catch (e) {
      app.showError(`The kit file "${file.name}" was not imported: ${e.message} Your saved kit is unchanged.`);
    }
  });
}

export function renderKit(app) {
  const k = app.state.kit;
  $('stations').replaceChildren(...k.stations.map((s) => {
    const tel = k.items.find((i) => i.id === (s.telescope || s.binocular));
    const li = el('li', { className: s.id === app.state.stationId ? 'current' : '' },
      el('button', { className: 'pick', type: 'button', textContent: s.name, title: 'Use this station' },
        el('span', { className: 'sub', textContent: `${tel ? tel.name : '?'} · ${s.eyepieces.length} eyepiece(s)` })),
      el('button', { className: 'btn small', type: 'button', textContent: 'Edit' }));
    li.children[0].addEventListener('click', () => app.chooseStation(s.id));
    li.children[1].addEventListener('click', () => editStation(app, s.id));
    li.dataset.station = s.id;
    return li;
  }));
  $('items').replaceChildren(...k.items.map((it) => {
    const li = el('li', {},
      el('span', { className: 'grow', textContent: it.name }, el('span', { className: 'sub', textContent: `${KINDS[it.kind].label} · ${describeItem(it)}` })),
      el('button', { className: 'btn small', type: 'button', textContent: 'Edit' }),
      el('button', { className: 'btn small', type: 'button', textContent: 'Remove' }));
    li.dataset.item = it.id;
    li.children[1].addEventListener('click', () => editItem(app, it.id));
    li.children[2].addEventListener('click', () => {
      if (!window.confirm(`Remove "${it.name}" from the kit?`)) return;
      app.updateKit((kk) => removeItem(kk, it.id));
    });
    return li;
  }));
  app.refreshKitNote();
}

function field(label, input) { return el('label', {}, label, input); }

function editItem(app, id) {
  const form = $('item-form');
  const it = app.state.kit.items.find((i) => i.id === id);
  if (!it) return;
  const def = KINDS[it.kind];
  const inputs = {};
  const kids = [el('h2', { textContent: `Edit ${def.label.toLowerCase()}` })];
  inputs.name = el('input', { type: 'text', value: it.name, name: 'name', maxLength: 80 });
  kids.push(field('Name', inputs.name));
  for (const [key, label, min, max, required] of def.fields) {
    inputs[key] = el('input', { type: 'number', step: 'any', inputMode: 'decimal', name: key, min: String(min), max: String(max), required, value: it[key] ?? '' });
    kids.push(field(label, inputs[key]));
  }
  for (const [key, options] of Object.entries(def.choices || {})) {
    inputs[key] = el('select', { name: key }, ...options.map(([v, label]) => el('option', { value: v, textContent: label, selected: it[key] === v })));
    kids.push(field({ design: 'Design', mount: 'Mount', prism: 'Type' }[key] || key, inputs[key]));
  }
  const save = el('button', { className: 'btn primary', type: 'submit', textContent: 'Save' });
  const cancel = el('button', { className: 'btn', type: 'button', textContent: 'Cancel' });
  kids.push(el('div', { className: 'row' }, save, cancel));
  form.replaceChildren(...kids);
  form.noValidate = true; // our own check gives the plain message with the allowed range
  form.hidden = false;
  $('station-form').hidden = true;
  cancel.addEventListener('click', () => { form.hidden = true; });
  form.onsubmit = (ev) => {
    ev.preventDefault();
    const next = { ...it, name: inputs.name.value.trim() || def.label };
    for (const [key] of def.fields) {
      const raw = inputs[key].value.trim();
      if (raw === '') delete next[key]; else next[key] = Number(raw);
    }
    for (const key of Object.keys(def.choices || {})) next[key] = inputs[key].value;
    if (app.updateKit((k) => ({ ...k, items: k.items.map((i) => (i.id === id ? next : i)) }))) form.hidden = true;
  };
  form.scrollIntoView({ block: 'nearest' });
  inputs.name.focus();
}

function editStation(app, id) {
  const form = $('station-form');
  const k = app.state.kit;
  const st = k.stations.find((s) => s.id === id);
  if (!st) return;
  const sel = (kind, current, none) => el('select', {}, ...(none ? [el('option', { value: '', textContent: none })] : []),
    ...itemsOf(k, kind).map((i) => el('option', { value: i.id, textContent: i.name, selected: i.id === current })));
  const name = el('input', { type: 'text', value: st.name, maxLength: 80 });
  const optics = el('select', {}, ...[...itemsOf(k, 'telescope'), ...itemsOf(k, 'binocular')]
    .map((i) => el('option', { value: i.id, textContent: i.name, selected: i.id === (st.telescope || st.binocular) })));
  const diagonal = sel('diagonal', st.diagonal, 'no diagonal (straight through)');
  const barlow = sel('barlow', st.barlow, 'none');
  const camera = sel('camera', st.camera, 'none');
  const eps = itemsOf(k, 'eyepiece').map((e) => {
    const box = el('input', { type: 'checkbox', value: e.id, checked: st.eyepieces.includes(e.id) });
    return el('label', { className: 'switch' }, box, e.name);
  });
  const save = el('button', { className: 'btn primary', type: 'submit', textContent: 'Save station' });
  const cancel = el('button', { className: 'btn', type: 'button', textContent: 'Cancel' });
  const del = el('button', { className: 'btn', type: 'button', textContent: 'Remove station' });
  form.replaceChildren(el('h2', { textContent: 'Edit station' }), field('Name', name), field('Telescope or binoculars', optics),
    field('Diagonal', diagonal), field('Barlow lens / reducer', barlow), field('Camera', camera),
    el('fieldset', { className: 'editor' }, el('legend', { textContent: 'Eyepieces at this station' }), ...eps),
    el('div', { className: 'row' }, save, cancel, del));
  form.hidden = false;
  $('item-form').hidden = true;
  cancel.addEventListener('click', () => { form.hidden = true; });
  del.addEventListener('click', () => {
    if (!window.confirm(`Remove the station "${st.name}"? Its equipment stays in the kit.`)) return;
    app.updateKit((kk) => ({ ...kk, stations: kk.stations.filter((s) => s.id !== id) }));
    form.hidden = true;
  });
  form.onsubmit = (ev) => {
    ev.preventDefault();
    const chosen = k.items.find((i) => i.id === optics.value);
    const next = { ...st, name: name.value.trim() || st.name,
      telescope: chosen && chosen.kind === 'telescope' ? chosen.id : null, binocular: chosen && chosen.kind === 'binocular' ? chosen.id : null,
      diagonal: diagonal.value || null, barlow: barlow.value || null, camera: camera.value || null,
      eyepieces: eps.map((l) => l.querySelector('input')).filter((b) => b.checked).map((b) => b.value) };
    if (app.updateKit((kk) => ({ ...kk, stations: kk.stations.map((s) => (s.id === id ? next : s)) }))) form.hidden = true;
  };
  form.scrollIntoView({ block: 'nearest' });
}
