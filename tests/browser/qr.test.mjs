// Our QR encoder (www/js/qr.js), checked by an independent decoder (the jsqr package).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import jsQR from 'jsqr';
import { encodeQr } from '../../www/js/qr.js';

function raster(qr, scale = 4) {
  const n = (qr.size + 8) * scale;
  const px = new Uint8ClampedArray(n * n * 4).fill(255);
  for (let y = 0; y < qr.size; y++) for (let x = 0; x < qr.size; x++) {
    if (!qr.modules[y][x]) continue;
    for (let dy = 0; dy < scale; dy++) for (let dx = 0; dx < scale; dx++) {
      const i = (((y + 4) * scale + dy) * n + (x + 4) * scale + dx) * 4;
      px[i] = px[i + 1] = px[i + 2] = 0;
    }
  }
  return { px, n };
}

const b64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';
function linkLike(len, seed) {
  let s = 'http://127.0.0.1:8080/#s=', x = seed;
  for (let i = 0; i < len; i++) { x = (x * 1103515245 + 12345) >>> 0; s += b64[x >>> 26]; }
  return s;
}

test('decodes back to the same text across versions and levels', () => {
  const cases = [['hello', 'M'], [linkLike(40, 1), 'L'], [linkLike(120, 2), 'M'], [linkLike(300, 3), 'Q'],
    [linkLike(600, 4), 'M'], [linkLike(900, 5), 'L'], [linkLike(1400, 6), 'L']];
  const versions = new Set();
  for (const [text, ecl] of cases) {
    const qr = encodeQr(text, ecl);
    versions.add(qr.version);
    assert.equal(qr.size, qr.version * 4 + 17);
    const { px, n } = raster(qr);
    const got = jsQR(px, n, n);
    assert.ok(got, `jsqr found no code for ${text.length} chars at ${ecl} (version ${qr.version})`);
    assert.equal(got.data, text, `version ${qr.version}`);
    assert.equal(got.version, qr.version);
  }
  assert.ok(versions.size >= 6, `covered versions ${[...versions]}`);
});

test('every mask decodes (mask choice is not what makes it readable)', () => {
  const text = linkLike(200, 9);
  const masks = new Set();
  for (let s = 0; s < 40 && masks.size < 4; s++) {
    const t = text + b64[s];
    const qr = encodeQr(t, 'M');
    masks.add(qr.mask);
    const { px, n } = raster(qr);
    assert.equal(jsQR(px, n, n)?.data, t);
  }
});

test('too long text is refused in words', () => {
  assert.throws(() => encodeQr('x'.repeat(3000), 'L'), /holds fewer/);
});
