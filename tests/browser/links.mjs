// Builds share links in Node, independently of the Rust codec, from its documented layout
// (src/share.rs): [version u8][raw DEFLATE of JSON][CRC-32 LE of the preceding bytes], base64url.
import zlib from 'node:zlib';

export function crc32(buf) {
  let c = 0xffffffff;
  for (const b of buf) {
    c ^= b;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  }
  return (c ^ 0xffffffff) >>> 0;
}

export function linkPayload(obj, version = 1) {
  const body = Buffer.concat([Buffer.from([version]), zlib.deflateRawSync(Buffer.from(JSON.stringify(obj)))]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32LE(crc32(body));
  return Buffer.concat([body, crc]).toString('base64url');
}

export function readPayload(payload) {
  const b = Buffer.from(payload, 'base64url');
  const body = b.subarray(0, b.length - 4);
  if (crc32(body) !== b.readUInt32LE(b.length - 4)) throw new Error('bad crc');
  return { version: b[0], value: JSON.parse(zlib.inflateRawSync(body.subarray(1)).toString()) };
}
