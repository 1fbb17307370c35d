// The same scenarios render to the same bytes natively and in wasm: the wasm buffer
// (not the canvas, whose fonts and pixel ratio vary) is hashed and compared with the
// native build's hashes from src/bin/render_demo.rs.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { initSync, Engine, comparisonScenarios, frameHash } from '../../www/pkg/nightfield.js';

const root = new URL('../../', import.meta.url);
const FILES = ['stars_bright.nfs', 'stars_hip.nfs', 'stars_gaia.nfs', 'dso_openngc.nfd', 'ephemeris.bin'];

test('wasm frames are byte-identical to native frames', () => {
  const native = execFileSync('cargo', ['run', '-q', '--bin', 'render_demo', '--', 'catalog'], { cwd: root, encoding: 'utf8' })
    .trim().split('\n').map((l) => l.split(' '));
  initSync({ module: readFileSync(new URL('www/pkg/nightfield_bg.wasm', root)) });
  const eng = new Engine();
  for (const f of FILES) eng.loadCatalog(f, readFileSync(new URL(`catalog/${f}`, root)));
  const scenarios = comparisonScenarios();
  assert.equal(scenarios.length, native.length);
  for (const [name, json] of scenarios) {
    eng.setScenarioJson(json);
    const info = eng.render(480, 360, 2.0);
    const row = native.find((r) => r[0] === name);
    assert.ok(row, `native has ${name}`);
    assert.deepEqual([String(info.width), String(info.height), frameHash(eng)], row.slice(1), `${name}: wasm and native pixels differ`);
  }
});
