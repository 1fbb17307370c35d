// The eyepiece view: blits the engine's pixels, draws its labels as text, and turns
// drag / pinch / wheel into engine pans and eyepiece steps. JS draws no sky.

export function sizeCanvas(canvas) {
  const dpr = window.devicePixelRatio || 1;
  const css = Math.max(64, Math.round(canvas.getBoundingClientRect().width));
  const px = Math.round(css * dpr);
  if (canvas.width !== px || canvas.height !== px) { canvas.width = px; canvas.height = px; }
  return { w: px, h: px, dpr };
}

const LABEL_FONT = (dpr) => `${Math.round(14 * dpr)}px system-ui, sans-serif`;

/** Render with `engine` into `canvas`; returns the engine's render info. */
export function paint(host, engine, canvas, night, labels = true) {
  const { w, h, dpr } = sizeCanvas(canvas);
  const info = host.call((e) => e.render(w, h, dpr), engine);
  const ctx = canvas.getContext('2d');
  ctx.putImageData(host.imageData(info), 0, 0);
  ctx.font = LABEL_FONT(dpr);
  ctx.textBaseline = 'middle';
  ctx.fillStyle = night ? '#ff3020' : '#d8e4ee';
  for (const l of labels ? info.labels || [] : []) {
    if (typeof l.text !== 'string') continue;
    ctx.fillText(l.text, l.x_px ?? l.x, l.y_px ?? l.y);
  }
  return info;
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
