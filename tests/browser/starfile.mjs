// Independent reader of the star file (*.nfs, layout 1), written from catalog/README.md alone,
// for the pixel test: it must not share code with the Rust decoder.
import fs from 'node:fs';

function unshuffle(buf, off, n, width) {
  // Byte-shuffled array: all low bytes, then all second bytes, ... Returns an array of unsigned ints.
  const out = new Array(n).fill(0);
  for (let b = 0; b < width; b++) {
    const base = off + b * n;
    for (let i = 0; i < n; i++) out[i] += buf[base + i] * 2 ** (8 * b);
  }
  return out;
}
const signed = (v, bits) => (v >= 2 ** (bits - 1) ? v - 2 ** bits : v);

export function readStars(file) {
  const buf = fs.readFileSync(file);
  if (buf.subarray(0, 8).toString('latin1') !== 'NFSTARS\0') throw new Error('not a star file');
  const version = buf.readUInt16LE(8), layout = buf[10], n = buf.readUInt32LE(12);
  const epoch = buf.readDoubleLE(16), zones = buf.readUInt16LE(24);
  if (version !== 1 || layout !== 1) throw new Error(`unsupported star file ${version}/${layout}`);
  let off = 64;
  // The zone table is plain u16 (the Rust decoder reads it so, despite the README's "every array").
  const cells = []; for (let z = 0; z < zones; z++) cells.push(buf.readUInt16LE(off + 2 * z)); off += zones * 2;
  const tiles = cells.reduce((a, b) => a + b, 0);
  const counts = unshuffle(buf, off, tiles, 4); off += tiles * 4;
  const col = (width) => { const a = unshuffle(buf, off, n, width); off += n * width; return a; };
  const ra = col(4), dec = col(4), pmra = col(4), pmdec = col(4), plx = col(4), v = col(2), bv = col(2), hip = col(4);
  // Undo the per-tile delta coding of RA and HIP (wrapping u32).
  let k = 0;
  for (const c of counts) {
    for (let j = 1; j < c; j++) {
      ra[k + j] = (ra[k + j] + ra[k + j - 1]) % 2 ** 32;
      hip[k + j] = (hip[k + j] + hip[k + j - 1]) % 2 ** 32;
    }
    k += c;
  }
  const stars = [];
  for (let i = 0; i < n; i++) {
    stars.push({
      ra_rad: (ra[i] * 2 * Math.PI) / 2 ** 32,
      dec_rad: (signed(dec[i], 32) * (Math.PI / 2)) / (2 ** 31 - 1),
      pm_ra_cosdec_mas_yr: signed(pmra[i], 32) / 10, pm_dec_mas_yr: signed(pmdec[i], 32) / 10,
      parallax_mas: signed(plx[i], 32) / 10, vmag: signed(v[i], 16) / 1000, hip: hip[i],
    });
  }
  return { epoch_jyear: epoch, stars };
}
