#!/usr/bin/python3
"""Brute-force coverage of a Walker delta shell with numpy: the outside yardstick for skein's coverage speed.

What an analyst would write in an afternoon: every grid point against every satellite at every sample instant,
vectorised over (points x satellites) at each instant. It reads the same design file as `skein coverage`
(one walker-delta shell, circular, global grid) and prints the area-weighted percent of time covered (fold 1).

Model (the simplifications are deliberate and stated):
  - Circular orbits, a = R_eq + altitude (the design's altitude is over the equatorial radius, as in skein),
    on J2 secular mean elements: node and argument of latitude advance at constant rates (below).
  - Earth rotation: GMST at the epoch (IAU 1982 expression, UTC taken as UT1) plus the WGS-84 rotation rate
    times the elapsed time; no polar motion, no precession or nutation over the day.
  - Earth model (--earth):
      sphere (default, the yardstick): ground points on a sphere of the WGS-84 mean radius R1 = (2a + b)/3
        (IUGG mean radius definition), elevation against the radial, cell areas of the sphere.
      wgs84 (a check, not timed): ground points on the WGS-84 ellipsoid, elevation against the geodetic
        normal, cell areas of the ellipsoid -- the Earth model skein uses -- so that a comparison with skein
        isolates the effect of sampling instants.
  - Percent covered: the share of the sample instants t = 0, step, ..., span (both ends) at which at least one
    satellite is at or above the elevation mask, area-weighted over the grid. Passes shorter than the step that
    fall between two instants are not seen; boundaries are resolved only to the step.
"""
import argparse
import datetime as dt
import sys

import numpy as np
import yaml

# WGS-84 defining constants (NIMA TR8350.2, 3rd ed., 2000) and J2 from its normalised C20 = -484.16685e-6
# (J2 = -sqrt(5) C20), the same set skein uses for `earth: wgs84`.
MU_KM3_S2 = 398600.4418
R_EQ_KM = 6378.137
FLATTENING = 1.0 / 298.257223563
OMEGA_EARTH_RAD_S = 7.292115e-5
J2 = 1.08262998905e-3


def secular_rates(a_km, i_rad):
    """J2 secular rates of a circular orbit (e = 0, p = a), Vallado, Fundamentals of Astrodynamics and
    Applications, 4th ed. (2013), eq. 9-41:
        dOmega/dt = -3/2 n J2 (R/p)^2 cos i
        domega/dt =  3/4 n J2 (R/p)^2 (4 - 5 sin^2 i)
        dM/dt     =  n + 3/4 n J2 (R/p)^2 sqrt(1 - e^2) (2 - 3 sin^2 i)
    For a circular orbit only the argument of latitude u = omega + M is defined; it advances at the sum of the
    last two. Returns (node rate, argument-of-latitude rate) in rad/s."""
    n = np.sqrt(MU_KM3_S2 / a_km**3)
    k = J2 * (R_EQ_KM / a_km) ** 2
    s2 = np.sin(i_rad) ** 2
    node_rate = -1.5 * n * k * np.cos(i_rad)
    argp_rate = 0.75 * n * k * (4.0 - 5.0 * s2)
    mean_anomaly_rate = n + 0.75 * n * k * (2.0 - 3.0 * s2)
    return node_rate, argp_rate + mean_anomaly_rate


def gmst_rad(epoch_utc):
    """Greenwich mean sidereal angle at a UTC instant taken as UT1: the IAU 1982 expression of Aoki et al.,
    A&A 105 (1982) 359, in the form of Vallado (2013) sec. 3.5.2 (seconds of time, T in Julian centuries of
    UT1 from J2000.0 including the day fraction):
        GMST = 67310.54841 + (876600 h + 8640184.812866) T + 0.093104 T^2 - 6.2e-6 T^3  [s]"""
    unix_s = epoch_utc.timestamp()
    jd = 2440587.5 + unix_s / 86400.0  # the Unix epoch is JD 2440587.5
    t = (jd - 2451545.0) / 36525.0
    gmst_s = 67310.54841 + (876600.0 * 3600.0 + 8640184.812866) * t + 0.093104 * t * t - 6.2e-6 * t**3
    return (np.mod(gmst_s, 86400.0) / 86400.0) * 2.0 * np.pi


def walker_delta(total, planes, phasing, raan0_deg):
    """Walker delta pattern T/P/F: plane p has node raan0 + 360 p / P; slot k of plane p has argument of
    latitude 360 k / (T/P) + 360 F p / T (J.G. Walker, "Satellite constellations", JBIS 37 (1984) 559-572;
    citation from memory). Returns (node, u) at the epoch."""
    per_plane = total // planes
    p, k = np.divmod(np.arange(total), per_plane)
    raan = np.radians(raan0_deg + 360.0 * p / planes)
    u = np.radians(360.0 * k / per_plane + 360.0 * phasing * p / total)
    return raan, u


def satellite_positions_ecef(a_km, i_rad, raan0, u0, times_s, theta0):
    """Earth-fixed positions (n_times, n_sats, 3) in km: the circular orbit rotated by the node less the
    Greenwich angle (Earth-fixed node longitude), i.e. R3(-(Omega - theta)) R1(-i) [a cos u, a sin u, 0]."""
    node_rate, u_rate = secular_rates(a_km, i_rad)
    t = times_s[:, None]
    u = u0[None, :] + u_rate * t
    node_lon = raan0[None, :] + node_rate * t - (theta0 + OMEGA_EARTH_RAD_S * t)
    cu, su, cl, sl = np.cos(u), np.sin(u), np.cos(node_lon), np.sin(node_lon)
    ci, si = np.cos(i_rad), np.sin(i_rad)
    return a_km * np.stack([cl * cu - sl * su * ci, sl * cu + cl * su * ci, su * si], axis=-1)


def grid(spacing_deg, earth):
    """Cell centres of the global grid, lat = -90 + (i + 1/2) s, lon = -180 + (j + 1/2) s, as skein places
    them. Returns Earth-fixed positions (km), unit local verticals and area weights summing to 1."""
    rows, cols = round(180.0 / spacing_deg), round(360.0 / spacing_deg)
    lat_edges = np.radians(-90.0 + spacing_deg * np.arange(rows + 1))
    lat = np.radians(-90.0 + spacing_deg * (np.arange(rows) + 0.5))
    lon = np.radians(-180.0 + spacing_deg * (np.arange(cols) + 0.5))
    lat, lon = [x.ravel() for x in np.meshgrid(lat, lon, indexing="ij")]
    up = np.stack([np.cos(lat) * np.cos(lon), np.cos(lat) * np.sin(lon), np.sin(lat)], axis=-1)
    if earth == "sphere":
        radius_km = R_EQ_KM * (1.0 - FLATTENING / 3.0)  # (2a + b) / 3
        pos = radius_km * up
        zone = np.diff(np.sin(lat_edges))  # area of a latitude zone on the sphere is prop. to d(sin lat)
    else:
        # Geodetic latitude on the ellipsoid: N = a / sqrt(1 - e^2 sin^2 lat) (NIMA TR8350.2 eq. 4-14); the
        # unit normal is the geodetic up. Zone areas from the authalic function q (Snyder, USGS PP 1395, 3-12).
        e2 = FLATTENING * (2.0 - FLATTENING)
        n = R_EQ_KM / np.sqrt(1.0 - e2 * np.sin(lat) ** 2)
        pos = np.stack([n * np.cos(lat) * np.cos(lon), n * np.cos(lat) * np.sin(lon),
                        n * (1.0 - e2) * np.sin(lat)], axis=-1)
        e, s = np.sqrt(e2), np.sin(lat_edges)
        q = (1.0 - e2) * (s / (1.0 - e2 * s * s) - np.log((1.0 - e * s) / (1.0 + e * s)) / (2.0 * e))
        zone = np.diff(q)
    weight = np.repeat(zone / cols, cols)
    return pos, up, weight / weight.sum()


def coverage_percent(pos, up, weight, sats_ecef, min_elevation_deg):
    """Area-weighted percent of the sample instants with at least one satellite at or above the mask.
    At each instant, for all (point, satellite) pairs at once: with d = r_sat - r_pt, the satellite is visible
    when sin(elevation) = d.up / |d| >= sin(mask). d.up and |d|^2 come from matrix products:
        d.up = r_sat.up - r_pt.up,  |d|^2 = |r_sat|^2 + |r_pt|^2 - 2 r_pt.r_sat."""
    sin_mask = np.sin(np.radians(min_elevation_deg))
    pt_up = np.einsum("ij,ij->i", pos, up)[:, None]
    pt_r2 = np.einsum("ij,ij->i", pos, pos)[:, None]
    covered_instants = np.zeros(len(pos), dtype=np.int64)
    for sats in sats_ecef:  # one sample instant: sats is (n_sats, 3)
        d_up = up @ sats.T - pt_up
        d2 = (sats * sats).sum(axis=1)[None, :] + pt_r2 - 2.0 * (pos @ sats.T)
        visible = d_up >= sin_mask * np.sqrt(d2)
        covered_instants += visible.any(axis=1)
    return 100.0 * float(weight @ covered_instants) / len(sats_ecef)


def parse_epoch(value):
    if isinstance(value, dt.datetime):
        return value if value.tzinfo else value.replace(tzinfo=dt.timezone.utc)
    return dt.datetime.fromisoformat(str(value).replace("Z", "+00:00"))


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("design", help="design YAML with one walker-delta shell and a global coverage grid")
    ap.add_argument("--earth", choices=["sphere", "wgs84"], default="sphere")
    ap.add_argument("--step", type=float, help="sample step in s (default: the design's coverage.step_s)")
    args = ap.parse_args()

    with open(args.design) as f:
        design = yaml.safe_load(f)
    shells = design["shells"]
    if len(shells) != 1 or shells[0].get("pattern") != "walker-delta":
        sys.exit("numpy_coverage.py: expected exactly one walker-delta shell")
    shell, cov = shells[0], design.get("coverage", {})
    if "ltan" in shell or "eccentricity" in shell or not isinstance(shell["inclination_deg"], (int, float)):
        sys.exit("numpy_coverage.py: expected a circular shell with a numeric inclination_deg and no ltan")
    if design.get("earth", "wgs84") != "wgs84":
        sys.exit("numpy_coverage.py: expected earth: wgs84 (the constants below)")
    grid_spec = cov.get("grid", {})
    if grid_spec.get("kind", "global") != "global" or "nadir_half_angle_deg" in cov:
        sys.exit("numpy_coverage.py: expected a global grid and no payload cone")
    spacing_deg = float(grid_spec.get("spacing_deg", 2.0))
    min_elevation_deg = float(cov.get("min_elevation_deg", 10.0))
    span_s = 3600.0 * float(cov.get("span_h", 24.0))
    step_s = args.step or float(cov.get("step_s", 60.0))

    a_km = R_EQ_KM + float(shell["altitude_km"])
    i_rad = np.radians(float(shell["inclination_deg"]))
    raan0, u0 = walker_delta(int(shell["satellites"]), int(shell["planes"]), int(shell["phasing"]),
                             float(shell.get("raan_deg", 0.0)))
    times_s = np.arange(0.0, span_s + 0.5 * step_s, step_s)
    times_s = times_s[times_s <= span_s * (1.0 + 1e-12)]
    sats = satellite_positions_ecef(a_km, i_rad, raan0, u0, times_s, gmst_rad(parse_epoch(design["epoch"])))
    pos, up, weight = grid(spacing_deg, args.earth)
    percent = coverage_percent(pos, up, weight, sats, min_elevation_deg)
    print(f"earth {args.earth}  points {len(pos)}  satellites {len(raan0)}  instants {len(times_s)}  "
          f"step_s {step_s:g}")
    print(f"percent_covered {percent:.4f}")


if __name__ == "__main__":
    main()
