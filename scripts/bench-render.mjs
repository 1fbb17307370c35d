// Render A/B helper: the render workload alone, native beside wasm in alternating
// rounds, for trying render changes (`make bench` remains the measurement of record).
// Usage: node scripts/bench-render.mjs PKG_DIR NATIVE_BENCH_BIN [rounds]
// PKG_DIR: a wasm build with the `bench` feature (scripts/build-wasm.sh DIR --bench);
// NATIVE_BENCH_BIN: the native `bench` binary, run as `bench --render 400`.
import { readFileSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
const [pkg, native, rounds = '5'] = process.argv.slice(2);
const { initSync, Bench } = await import(pkg + '/nightfield.js');
initSync({ module: readFileSync(pkg + '/nightfield_bg.wasm') });
const bench = new Bench();
const ratios = { native: [], wasm: [], wn: [] };
for (let i = 0; i < Number(rounds); i++) {
  const [nf, nfl] = execFileSync(native, ['--render', '400']).toString().trim().split(/\s+/).map(Number);
  const [wf, wfl] = bench.render(400);
  ratios.native.push(nf / nfl);
  ratios.wasm.push(wf / wfl);
  ratios.wn.push(wf / nf);
  console.log(`round ${i}: native ${(nf / 1e6).toFixed(3)} / ${(nfl / 1e6).toFixed(3)} = ${(nf / nfl).toFixed(2)}   wasm ${(wf / 1e6).toFixed(3)} / ${(wfl / 1e6).toFixed(3)} = ${(wf / wfl).toFixed(2)}   wasm/native ${(wf / nf).toFixed(2)}`);
}
const med = (v) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)].toFixed(2);
console.log(`median of rounds: frame/floor native ${med(ratios.native)}, wasm ${med(ratios.wasm)} (target ≤ 4); render wasm/native ${med(ratios.wn)} (target ≤ 1.3)`);
