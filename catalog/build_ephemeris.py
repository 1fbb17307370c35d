#!/usr/bin/env python3
"""Build catalog/ephemeris.bin: compact Chebyshev fits to JPL DE421.

Source: JPL DE421 (public domain), the de421.bsp file shipped in the PyPI
package skyfield-data, read with jplephem. Build command (from the repo root):

    python3 catalog/build_ephemeris.py            # writes catalog/ephemeris.bin
    python3 catalog/build_ephemeris.py --check    # rebuilds in memory, exit 1 if it differs

For each body the script tries interval lengths (powers of two days) and
finds the fewest coefficients that keep the fit, as the Rust decoder will
evaluate it (quantized coefficients, Clenshaw in float64), under the body's
tolerance at 8 points per coefficient in every interval over the whole span.
It keeps the (interval, degree) with the smallest encoded size.

File layout (little-endian), version 1:
  magic  b"NFSOLEPH"
  u16 version, u16 body_count
  f64 start_jd (TDB), f64 span_days, f64 emrat (Earth/Moon mass ratio)
  per body (32 bytes): u8 body_code, u8 ncoef, u16 reserved(0), u32 n_intervals,
      f64 interval_days, f64 quantum_km, u32 payload_bytes, u32 reserved(0)
  payloads, in body order: for each interval, for x, y, z, ncoef coefficients
      as zigzag LEB128 integers; coefficient = integer * quantum_km (km)
  u64 FNV-1a 64 of every byte before it.

Body codes: 0 Sun, 1 Moon (geocentric: Moon minus Earth), 2 Earth-Moon
barycentre, 3 Mercury, 4 Venus, 5 Mars barycentre, 6 Jupiter barycentre,
7 Saturn barycentre, 8 Uranus barycentre, 9 Neptune barycentre. All except the
Moon are barycentric (ICRF axes). Earth = EMB - Moon / (1 + emrat).
"""
import gzip
import os
import struct
import sys

import numpy as np
import skyfield_data
from jplephem.spk import SPK

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "ephemeris.bin")
START_JD = 2433282.5          # 1950-01-01 00:00 TDB
SPAN_DAYS = 36864.0           # 72 x 512 days: to 2050-12-06 (DE421 ends 2053-10-09)
AU_KM = 149597870.7

# (code, name, tolerance_km): tolerances keep each body's fit error well under
# 0.1 arcsec at its nearest approach to the Earth (Moon 356000 km: 0.2 km = 0.12").
BODIES = [
    (0, "sun", 3.0),
    (1, "moon", 0.15),
    (2, "emb", 1.5),
    (3, "mercury", 3.0),
    (4, "venus", 3.0),
    (5, "mars", 3.0),
    (6, "jupiter", 30.0),
    (7, "saturn", 50.0),
    (8, "uranus", 100.0),
    (9, "neptune", 100.0),
]
INTERVALS = [8.0, 16.0, 32.0, 64.0, 128.0, 256.0, 512.0]


def kernel():
    path = os.path.join(skyfield_data.get_skyfield_data_path(), "de421.bsp")
    return SPK.open(path)


def body_fn(k, name):
    seg = {"sun": (0, 10), "emb": (0, 3), "mercury": (0, 1), "venus": (0, 2),
           "mars": (0, 4), "jupiter": (0, 5), "saturn": (0, 6), "uranus": (0, 7),
           "neptune": (0, 8)}
    if name == "moon":
        return lambda jd: k[3, 301].compute(jd) - k[3, 399].compute(jd)
    c, t = seg[name]
    return lambda jd: k[c, t].compute(jd)


# DE421's EMRAT constant (Folkner et al. 2008); checked against the kernel below.
EMRAT = 81.30056907419062


def emrat(k):
    # Earth offset from the EMB is -Moon/(1+emrat): check the constant on DE421 itself.
    jd = np.array([2451545.0, 2440000.0])
    e = k[3, 399].compute(jd)
    m = k[3, 301].compute(jd)
    r = np.linalg.norm(m - e, axis=0) / np.linalg.norm(e, axis=0) - 1.0
    if np.max(np.abs(r - EMRAT)) > 1e-6:
        raise SystemExit(f"EMRAT check failed: kernel gives {r}")
    return EMRAT


def fit(fun, days, n):
    """Chebyshev interpolation at the n Chebyshev-Gauss nodes of each interval.
    Sums run in a fixed order over elementwise ops (no BLAS), so the bytes
    do not depend on the machine."""
    nint = int(round(SPAN_DAYS / days))
    a = START_JD + days * np.arange(nint)
    th = np.pi * (np.arange(n) + 0.5) / n
    x = np.cos(th)
    jd = (a[:, None] + days / 2 * (x[None, :] + 1.0)).ravel()
    f = fun(jd).reshape(3, nint, n)  # km
    c = np.zeros((nint, 3, n))
    for kk in range(n):
        acc = np.zeros((3, nint))
        w = np.cos(kk * th)
        for j in range(n):
            acc = acc + f[:, :, j] * w[j]
        c[:, :, kk] = acc.T * (2.0 / n)
    c[:, :, 0] *= 0.5
    return c, a


def clenshaw(c, x):
    """c: (nint, 3, n); x: (m,) in [-1, 1] -> (nint, 3, m), as the Rust decoder."""
    n = c.shape[2]
    b1 = np.zeros(c.shape[:2] + (x.size,))
    b2 = np.zeros_like(b1)
    for kk in range(n - 1, 0, -1):
        b1, b2 = 2.0 * x * b1 - b2 + c[:, :, kk, None], b1
    return x * b1 - b2 + c[:, :, 0, None]


def zigzag_leb128(values):
    out = bytearray()
    for v in values:
        u = (v << 1) ^ (v >> 63)
        u &= (1 << 64) - 1
        while True:
            b = u & 0x7F
            u >>= 7
            if u:
                out.append(b | 0x80)
            else:
                out.append(b)
                break
    return bytes(out)


def quantize(c, q):
    return np.rint(c / q).astype(np.int64)


def max_error_km(fun, c, q_int, q, days, a):
    n = c.shape[2]
    m = 8 * n
    x = np.linspace(-1.0, 1.0, m)
    got = clenshaw(q_int.astype(np.float64) * q, x)
    jd = (a[:, None] + days / 2 * (x[None, :] + 1.0)).ravel()
    want = fun(jd).reshape(3, a.size, m).transpose(1, 0, 2)
    return float(np.max(np.linalg.norm(got - want, axis=1)))


def best_fit(fun, tol_km):
    q = tol_km / 32.0
    best = None
    for days in INTERVALS:
        for n in range(4, 40):
            c, a = fit(fun, days, n)
            qi = quantize(c, q)
            err = max_error_km(fun, c, qi, q, days, a)
            if err <= tol_km:
                payload = zigzag_leb128(int(v) for v in qi.ravel())
                if best is None or len(payload) < len(best[3]):
                    best = (days, n, err, payload, a.size, q)
                break
    return best


def fnv1a64(data):
    h = 0xCBF29CE484222325
    for b in data:
        h ^= b
        h = (h * 0x100000001B3) & 0xFFFFFFFFFFFFFFFF
    return h


def build(verbose=True):
    k = kernel()
    er = emrat(k)
    head = bytearray(b"NFSOLEPH")
    head += struct.pack("<HH", 1, len(BODIES))
    head += struct.pack("<ddd", START_JD, SPAN_DAYS, er)
    table = bytearray()
    payloads = bytearray()
    for code, name, tol in BODIES:
        days, n, err, payload, nint, q = best_fit(body_fn(k, name), tol)
        table += struct.pack("<BBHIddII", code, n, 0, nint, days, q, len(payload), 0)
        payloads += payload
        if verbose:
            print(f"{name:8s} interval {days:5.0f} d  {n:2d} coefs  {nint:5d} intervals  "
                  f"max fit error {err:8.4f} km (tolerance {tol} km)  {len(payload):7d} bytes")
    data = bytes(head + table + payloads)
    data += struct.pack("<Q", fnv1a64(data))
    if verbose:
        print(f"emrat {er:.9f}; raw {len(data)} bytes, gzipped {len(gzip.compress(data, 9, mtime=0))} bytes")
    return data


def main():
    check = "--check" in sys.argv[1:]
    data = build()
    if check:
        with open(OUT, "rb") as f:
            old = f.read()
        if old != data:
            print("catalog/ephemeris.bin differs from a fresh build", file=sys.stderr)
            sys.exit(1)
        print("catalog/ephemeris.bin is up to date")
        return
    with open(OUT, "wb") as f:
        f.write(data)


if __name__ == "__main__":
    main()
