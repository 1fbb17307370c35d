// The figures beside the view, and the solar caution. Field names follow the engine's
// figures object; unknown extra numeric fields are listed too so nothing is hidden.

const fmt = (v, d) => (typeof v === 'number' && Number.isFinite(v) ? v.toFixed(d) : null);
const RAD = 180 / Math.PI;

function angle(deg) {
  if (typeof deg !== 'number' || !Number.isFinite(deg)) return null;
  if (deg >= 1) return `${deg.toFixed(2)}°`;
  const m = deg * 60;
  return m >= 1 ? `${m.toFixed(1)}′` : `${(m * 60).toFixed(0)}″`;
}
function duration(s) {
  if (typeof s !== 'number' || !Number.isFinite(s)) return null;
  if (s < 90) return `${s.toFixed(0)} s`;
  if (s < 5400) return `${(s / 60).toFixed(1)} min`;
  return `${(s / 3600).toFixed(1)} h`;
}
const pick = (f, ...keys) => { for (const k of keys) if (f[k] !== undefined && f[k] !== null) return f[k]; return undefined; };
const deg = (f, dKey, rKey) => { const d = f[dKey]; if (typeof d === 'number') return d; const r = f[rKey]; return typeof r === 'number' ? r * RAD : undefined; };

export function figureRows(f) {
  const rows = [];
  const add = (label, value) => { if (value !== null && value !== undefined && value !== '') rows.push([label, value]); };
  add('Target', pick(f, 'target_name', 'target'));
  add('Magnification', fmt(pick(f, 'magnification'), 0) && `${fmt(f.magnification, 0)}×`);
  add('True field', angle(deg(f, 'true_field_deg', 'true_field_rad')));
  add('Exit pupil', fmt(pick(f, 'exit_pupil_mm'), 1) && `${fmt(f.exit_pupil_mm, 1)} mm`);
  add('Focal ratio', fmt(pick(f, 'focal_ratio'), 1) && `f/${fmt(f.focal_ratio, 1)}`);
  add('Orientation', pick(f, 'orientation', 'orientation_words'));
  const alt = deg(f, 'alt_deg', 'alt_rad');
  add('Altitude', alt === undefined ? null : `${alt.toFixed(1)}°${alt < 0 ? ' (below the horizon)' : ''}`);
  const az = deg(f, 'az_deg', 'az_rad');
  add('Azimuth', az === undefined ? null : `${az.toFixed(1)}°`);
  add('Drift time', duration(pick(f, 'drift_s', 'drift_time_s')));
  add('Target size', pick(f, 'size_words'));
  add('Visibility', pick(f, 'visibility', 'visibility_words'));
  return rows;
}

export function renderFigures(dl, f, notes) {
  dl.replaceChildren();
  for (const [k, v] of figureRows(f || {})) {
    const dt = document.createElement('dt'); dt.textContent = k;
    const dd = document.createElement('dd'); dd.textContent = String(v);
    dl.append(dt, dd);
  }
  // The engine's advice (exit pupil, field stop, ...) folds away under the figures: on a
  // phone it pushed the panels a screen further down.
  const advice = f && Array.isArray(f.advice) ? f.advice.map(String) : [];
  if (!notes) return;
  notes.hidden = !advice.length;
  notes.querySelector('summary').textContent = `Notes on this view (${advice.length})`;
  const ul = notes.querySelector('ul');
  ul.replaceChildren(...advice.map((a) => { const li = document.createElement('li'); li.textContent = a; return li; }));
}

/** The Sun caution when the Sun is up or close to the target: { title, text }, or null. */
export function solarCaution(f, targetName) {
  if (!f) return null;
  const sunAlt = deg(f, 'sun_alt_deg', 'sun_alt_rad');
  const sep = deg(f, 'sun_separation_deg', 'sun_separation_rad');
  const isSun = /^\s*(the\s+)?sun\s*$/i.test(String(targetName || ''));
  const near = typeof sep === 'number' && sep < 15;
  const up = typeof sunAlt === 'number' && sunAlt > -0.9;
  if (!isSun && !near && !up) return null;
  const title = isSun ? '⚠ Caution: the target is the Sun' : near ? `⚠ Caution: the Sun is only ${sep.toFixed(0)}° from the target` : '⚠ Caution: the Sun is up';
  return {
    title,
    text: 'Sunlight through a telescope, binoculars or a finder blinds in an instant. Never look at or near the Sun '
      + 'without a proper full-aperture solar filter, checked for damage and fitted securely over the front; observe the Sun '
      + 'only as local rules and trained practice allow. Cap or remove the finder, and never leave a telescope near the Sun unattended.',
  };
}
