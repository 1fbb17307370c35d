// Prints the bench report: medians native and wasm, and the ratios of the targets.
const [n, w] = process.argv.slice(2).map((s) => JSON.parse(s));
const ms = (ns) => (ns / 1e6).toFixed(3);
const rows = [
  ['render 1024² rich field', 'render_frame_ns'], ['  floor: fill + copy 1024²', 'render_floor_ns'],
  ['cone query via index (1° field, deep tier)', 'cone_index_ns'], ['cone query by full scan', 'cone_scan_ns'],
  ['all bodies, one instant', 'bodies_instant_ns'], ['all bodies, 8 h in 5-min steps', 'bodies_night_ns'],
  ['night plan 300 targets × 6 stations', 'plan_300x6_ns'], ['star-hop route search (10° region)', 'route_search_ns'],
  ['decode deep star tier', 'decode_deep_ns'], ['set scenario (compose the demo view)', 'scenario_ns'],
];
console.log('[bench] medians in ms          native      wasm   wasm/native');
for (const [label, k] of rows) {
  console.log(`[bench] ${label.padEnd(44)} ${ms(n[k]).padStart(9)} ${ms(w[k]).padStart(9)}   ${(w[k] / n[k]).toFixed(2)}`);
}
console.log(`[bench] frame / floor: native ${(n.render_frame_ns / n.render_floor_ns).toFixed(2)}, wasm ${(w.render_frame_ns / w.render_floor_ns).toFixed(2)} (target ≤ 4)`);
console.log(`[bench] render wasm / native across the two processes above: ${(w.render_frame_ns / n.render_frame_ns).toFixed(2)} (the host drifts between them; the target, ≤ 1.3, is judged on the alternating rounds below)`);
console.log(`[bench] cone index speed-up: native ${(n.cone_scan_ns / n.cone_index_ns).toFixed(0)}×, wasm ${(w.cone_scan_ns / w.cone_index_ns).toFixed(0)}× (target ≥ 100×; ${n.cone_stars_found} stars found in 64 fields of 1° at G ≤ 10 in the deep tier)`);
