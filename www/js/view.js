// The eyepiece view: blits the engine's pixels, draws its labels as text, and turns
// drag / pinch / wheel into engine pans and eyepiece steps. JS draws no sky.

export function sizeCanvas(canvas) {
  const dpr = window.devicePixelRatio || 1;
  const css = Math.max(64, Math.round(canvas.getBoundingClientRect().width));
  const px = Math.round(css * dpr);
  if (canvas.width !== px || canvas.height !== px) { canvas.width = px; canvas.height = px; }
  return { w: px, h: px, dpr };
}

const LABEL_PX = 14;
const LABEL_FONT = (dpr) => `${Math.round(LABEL_PX * dpr)}px system-ui, sans-serif`;
const kindOf = (l) => String(l.kind || '').toLowerCase();

/** Render with `engine` into `canvas`; returns the engine's render info plus `drift`, the
 *  drift label's words (shown under the view: on the drawing it would cross stars and the rim). */
export function paint(host, engine, canvas, night, labels = true) {
  const { w, h, dpr } = sizeCanvas(canvas);
  const info = host.call((e) => e.render(w, h, dpr), engine);
  const ctx = canvas.getContext('2d');
  ctx.putImageData(host.imageData(info), 0, 0);
  const all = (info.labels || []).filter((l) => typeof l.text === 'string');
  info.drift = all.find((l) => kindOf(l) === 'drift')?.text || null;
  if (labels) drawLabels(ctx, all.filter((l) => kindOf(l) !== 'drift'), w, h, dpr, night);
  return info;
}

/** Labels as text with a dark halo (readable over stars and glows), kept inside the canvas
 *  and off each other: edge marks (zenith) are set outward from the field, the compass
 *  letters centred on their arrows, a repeat of the target's name is left out, and a label
 *  that would cover an earlier one moves down or up a line, or is left out. */
function drawLabels(ctx, labels, w, h, dpr, night) {
  ctx.font = LABEL_FONT(dpr);
  ctx.textBaseline = 'middle';
  ctx.lineJoin = 'round';
  ctx.lineWidth = 3 * dpr;
  ctx.strokeStyle = '#000';
  ctx.fillStyle = night ? '#ff3020' : '#d8e4ee';
  const line = (LABEL_PX + 3) * dpr;
  const pad = 2 * dpr;
  const placed = [];
  const hits = (b) => placed.some((o) => b.x < o.x + o.w && o.x < b.x + b.w && b.y < o.y + o.h && o.y < b.y + b.h);
  // The target first, so it keeps its place.
  const order = [...labels].sort((a, b) => (kindOf(a) === 'target' ? 0 : 1) - (kindOf(b) === 'target' ? 0 : 1));
  for (const l of order) {
    const k = kindOf(l);
    const tw = ctx.measureText(l.text).width;
    let x = l.x_px ?? l.x;
    const y0 = l.y_px ?? l.y;
    if (!Number.isFinite(x) || !Number.isFinite(y0)) continue;
    // The target's own catalogue label ("M 45") under its name label ("M 45 (Pleiades)").
    if (k !== 'target' && placed.some((o) => o.text.startsWith(l.text))) continue;
    if (k === 'north' || k === 'east') x -= tw / 2;
    else if (k === 'zenith') {
      // Outward from the field; pushed back inside at the top or bottom edge, beside its tick, not over it.
      const offEdge = y0 < line / 2 || y0 > h - line / 2;
      x = offEdge ? x + 8 * dpr : x < w * 0.4 ? x - tw : x > w * 0.6 ? x : x - tw / 2;
    }
    x = Math.min(Math.max(pad, x), w - tw - pad);
    let box = null;
    for (const dy of [0, line, -line, 2 * line, -2 * line]) {
      const y = Math.min(Math.max(line / 2, y0 + dy), h - line / 2);
      const b = { x, y: y - line / 2, w: tw, h: line, text: l.text };
      if (!hits(b)) { box = b; break; }
    }
    if (!box) continue;
    placed.push(box);
    ctx.strokeText(l.text, box.x, box.y + line / 2);
    ctx.fillText(l.text, box.x, box.y + line / 2);
  }
}

/** Pointer gestures: one finger drags (pan), two fingers pinch (eyepiece step), wheel steps. */
export function attachGestures(canvas, { onPan, onStep }) {
  const pts = new Map();
  let pinchStart = null;
  canvas.addEventListener('pointerdown', (ev) => {
    try { canvas.setPointerCapture(ev.pointerId); } catch (e) { /* pointer already gone */ }
    pts.set(ev.pointerId, { x: ev.clientX, y: ev.clientY });
    if (pts.size === 2) pinchStart = spread(pts);
  });
  canvas.addEventListener('pointermove', (ev) => {
    const p = pts.get(ev.pointerId);
    if (!p) return;
    const dpr = window.devicePixelRatio || 1;
    if (pts.size === 1) {
      onPan((ev.clientX - p.x) * dpr, (ev.clientY - p.y) * dpr);
    }
    pts.set(ev.pointerId, { x: ev.clientX, y: ev.clientY });
    if (pts.size === 2 && pinchStart) {
      const ratio = spread(pts) / pinchStart;
      if (ratio > 1.35) { onStep(+1); pinchStart = spread(pts); }
      else if (ratio < 0.74) { onStep(-1); pinchStart = spread(pts); }
    }
  });
  const up = (ev) => { pts.delete(ev.pointerId); if (pts.size < 2) pinchStart = null; };
  canvas.addEventListener('pointerup', up);
  canvas.addEventListener('pointercancel', up);
  let wheelAcc = 0;
  canvas.addEventListener('wheel', (ev) => {
    ev.preventDefault();
    wheelAcc += ev.deltaY;
    if (Math.abs(wheelAcc) >= 80) { onStep(wheelAcc < 0 ? +1 : -1); wheelAcc = 0; }
  }, { passive: false });
}

function spread(pts) {
  const [a, b] = [...pts.values()];
  return Math.hypot(a.x - b.x, a.y - b.y) || 1;
}
