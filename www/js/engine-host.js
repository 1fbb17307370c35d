// Owns the wasm engine: loads it, feeds it catalogs, and starts a fresh instance if one dies.
// A Rust panic aborts the instance (a WebAssembly.RuntimeError); its memory is then unusable,
// so a new module instance is imported (a distinct URL gives a distinct module record).

const PKG = new URL('../pkg/nightfield.js', import.meta.url);
const WASM = new URL('../pkg/nightfield_bg.wasm', import.meta.url);

export class EngineHost {
  constructor({ onRestart } = {}) {
    this.generation = 0;
    this.catalogs = [];        // [name, Uint8Array] kept to reload a new instance
    this.onRestart = onRestart || (() => {});
    this.engine = null;
    this.memory = null;
    this.mod = null;
    this.extra = new Map();    // secondary engines (compare view), rebuilt on restart
  }

  async start() {
    this.generation += 1;
    const url = this.generation === 1 ? PKG.href : `${PKG.href}?instance=${this.generation}`;
    const mod = await import(url);
    const exports = await mod.default({ module_or_path: WASM });
    this.mod = mod;
    this.memory = exports.memory;
    this.engine = new mod.Engine();
    this.extra.clear();
    for (const [name, bytes] of this.catalogs) this.engine.loadCatalog(name, bytes);
    return this.engine;
  }

  loadCatalog(name, bytes) {
    this.catalogs.push([name, bytes]);
    this.call((e) => e.loadCatalog(name, bytes));
    for (const e of this.extra.values()) e.loadCatalog(name, bytes);
  }

  /** A second engine sharing this module (for the compare view). */
  secondary(key) {
    if (!this.extra.has(key)) {
      const e = new this.mod.Engine();
      for (const [name, bytes] of this.catalogs) e.loadCatalog(name, bytes);
      this.extra.set(key, e);
    }
    return this.extra.get(key);
  }

  /** Run fn(engine); if the instance died, say so, start a new one and rethrow a plain error. */
  call(fn, engine = null) {
    try {
      return fn(engine || this.engine);
    } catch (err) {
      if (err instanceof WebAssembly.RuntimeError) {
        this.dead = true;
        const why = err.message;
        this.restarting = this.start().then(() => { this.dead = false; this.onRestart(why); });
        const e = new Error(`The sky engine stopped (${why}). A new one is starting; nothing saved was lost.`);
        e.engineDied = true;
        throw e;
      }
      throw err;
    }
  }

  /** The engine's pixel buffer as ImageData, a zero-copy view of wasm memory (rebuilt each frame:
   *  memory growth detaches old views). */
  imageData(info) {
    const bytes = new Uint8ClampedArray(this.memory.buffer, info.ptr, info.len);
    return new ImageData(bytes, info.width, info.height);
  }
}
