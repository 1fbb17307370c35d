// A tiny static server for www/ on 127.0.0.1 (tests and `make serve`), with correct MIME
// types (application/wasm for streaming compile) and no-cache so worker updates are seen.
// Usage: node tests/browser/server.mjs [port] [root]
import http from 'node:http';
import fs from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const HERE = path.dirname(fileURLToPath(import.meta.url));
export const WWW = path.resolve(HERE, '../../www');
const CATALOG = path.resolve(HERE, '../../catalog');

const MIME = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8', '.json': 'application/json', '.webmanifest': 'application/manifest+json',
  '.wasm': 'application/wasm', '.svg': 'image/svg+xml', '.png': 'image/png', '.ico': 'image/x-icon',
  '.bin': 'application/octet-stream', '.txt': 'text/plain; charset=utf-8', '.map': 'application/json',
};

/** Start serving `root`; returns { url, port, close(), override(urlPath, body|null), requests }. */
export async function startServer({ root = WWW, port = 0 } = {}) {
  const overrides = new Map();
  const requests = [];
  const server = http.createServer(async (req, res) => {
    try {
      const u = new URL(req.url, 'http://127.0.0.1');
      let p = decodeURIComponent(u.pathname);
      requests.push(p);
      if (overrides.has(p)) return send(res, 200, MIME[path.extname(p)] || 'application/octet-stream', overrides.get(p));
      if (p.endsWith('/')) p += 'index.html';
      const file = path.resolve(root, `.${p}`);
      if (!file.startsWith(path.resolve(root) + path.sep)) return send(res, 403, 'text/plain', 'forbidden');
      let body;
      try { body = await fs.readFile(file); } catch (e) {
        // www/catalog/ may not be populated (the build copies it for dist): fall back to the repo's catalog/.
        if (e.code !== 'ENOENT' || !p.startsWith('/catalog/')) throw e;
        body = await fs.readFile(path.resolve(CATALOG, `.${p.slice('/catalog'.length)}`));
      }
      send(res, 200, MIME[path.extname(file)] || 'application/octet-stream', body);
    } catch (e) {
      send(res, e.code === 'ENOENT' || e.code === 'EISDIR' ? 404 : 500, 'text/plain', e.code === 'ENOENT' ? 'not found' : 'error');
    }
  });
  await new Promise((ok) => server.listen(port, '127.0.0.1', ok));
  const actual = server.address().port;
  return {
    url: `http://127.0.0.1:${actual}/`, port: actual, requests,
    override: (p, body) => (body === null ? overrides.delete(p) : overrides.set(p, body)),
    close: () => new Promise((ok) => { server.closeAllConnections?.(); server.close(ok); }),
  };
}

function send(res, code, type, body) {
  res.writeHead(code, { 'Content-Type': type, 'Cache-Control': 'no-cache', 'X-Content-Type-Options': 'nosniff' });
  res.end(body);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const port = Number(process.argv[2] || 8080);
  const root = process.argv[3] ? path.resolve(process.argv[3]) : WWW;
  startServer({ root, port }).then((s) => console.log(`Nightfield is served at ${s.url} (from ${root}); Ctrl-C stops it.`));
}
