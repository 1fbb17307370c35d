// Minimal astrometry for the pixel test, independent of the Rust code:
// linear proper motion, IAU 1976 precession (Lieske et al. 1977 angles ζ, z, θ) and the gnomonic projection.
const AS = Math.PI / 180 / 3600;

/** Propagate an ICRS position from epoch0 to epoch (Julian years), linear in the tangent plane. */
export function properMotion(star, epoch0, epoch) {
  const dt = epoch - epoch0;
  return {
    ra_rad: star.ra_rad + (star.pm_ra_cosdec_mas_yr * dt * AS / 1000) / Math.cos(star.dec_rad),
    dec_rad: star.dec_rad + star.pm_dec_mas_yr * dt * AS / 1000,
  };
}

/** J2000 mean place -> mean place of date, IAU 1976 precession (Lieske et al. 1977). */
export function precess(p, tt_jyear) {
  const T = (tt_jyear - 2000) / 100;
  const zeta = (2306.2181 * T + 0.30188 * T * T + 0.017998 * T ** 3) * AS;
  const z = (2306.2181 * T + 1.09468 * T * T + 0.018203 * T ** 3) * AS;
  const th = (2004.3109 * T - 0.42665 * T * T - 0.041833 * T ** 3) * AS;
  const a = p.ra_rad + zeta;
  const A = Math.cos(p.dec_rad) * Math.sin(a);
  const B = Math.cos(th) * Math.cos(p.dec_rad) * Math.cos(a) - Math.sin(th) * Math.sin(p.dec_rad);
  const C = Math.sin(th) * Math.cos(p.dec_rad) * Math.cos(a) + Math.cos(th) * Math.sin(p.dec_rad);
  return { ra_rad: Math.atan2(A, B) + z, dec_rad: Math.asin(C) };
}

/** Gnomonic (tangent-plane) projection about centre c: returns (east, north) in radians. */
export function gnomonic(p, c) {
  const dra = p.ra_rad - c.ra_rad;
  const cosc = Math.sin(c.dec_rad) * Math.sin(p.dec_rad) + Math.cos(c.dec_rad) * Math.cos(p.dec_rad) * Math.cos(dra);
  return {
    east: (Math.cos(p.dec_rad) * Math.sin(dra)) / cosc,
    north: (Math.cos(c.dec_rad) * Math.sin(p.dec_rad) - Math.sin(c.dec_rad) * Math.cos(p.dec_rad) * Math.cos(dra)) / cosc,
  };
}

export function separation(a, b) {
  const x = Math.sin(a.dec_rad) * Math.sin(b.dec_rad) + Math.cos(a.dec_rad) * Math.cos(b.dec_rad) * Math.cos(a.ra_rad - b.ra_rad);
  return Math.acos(Math.min(1, Math.max(-1, x)));
}
