// The wasm side of `make bench`: loads www/pkg in Node and runs the shared workloads.
import { readFileSync } from 'node:fs';
const PKG = process.env.NIGHTFIELD_PKG || new URL('../www/pkg/', import.meta.url).pathname;
const { initSync, Bench } = await import(PKG + '/nightfield.js');

const root = new URL('..', import.meta.url);
initSync({ module: readFileSync(PKG + '/nightfield_bg.wasm') });
const bench = new Bench();
for (const n of ['stars_bright.nfs', 'stars_hip.nfs', 'stars_gaia.nfs', 'dso_openngc.nfd', 'ephemeris.bin']) {
  bench.add(n, readFileSync(new URL(`catalog/${n}`, root)));
}
console.log(JSON.stringify(bench.run(process.argv.includes('--quick'))));
