#!/usr/bin/python3
"""Numerical reference for tests/budget/deployment_test.cpp: two circular orbits, 550 km and 450 km at 53 deg,
integrated under point-mass gravity plus J2 only (WGS-84 GM and Re, J2 from C20 = -484.16685e-6) with a
fixed-step fourth-order Runge-Kutta in numpy (20 s steps over 20 days). The J2 acceleration is the gradient of
U = -(mu/r) J2 (Re/r)^2 P2(z/r) (e.g. Vallado, "Fundamentals of Astrodynamics and Applications", 4th ed. 2013,
sec. 8.6.1; Curtis, "Orbital Mechanics for Engineering Students", ch. 12).

From the osculating states it prints, per orbit, the time-averaged osculating semi-major axis (to first order
in J2 the mean semi-major axis of the secular theory: the short-period terms of a average to zero over the
mean anomaly), and the least-squares slopes of the unwrapped node Omega and argument of latitude u over the
whole span, in deg/day. Run with /usr/bin/python3 (numpy from Debian); it takes under a minute.
"""
import numpy as np

MU = 398600.4418                  # km^3/s^2 (WGS-84)
RE = 6378.137                     # km (WGS-84)
J2 = -np.sqrt(5.0) * -484.16685e-6  # 1.08262998905e-3
ALT = np.array([550.0, 450.0])    # km, initial osculating circular radii - RE
INC = np.radians(53.0)
STEP = 20.0                       # s
DAYS = 20.0


def accel(r):
    x, y, z = r[:, 0], r[:, 1], r[:, 2]
    rn = np.sqrt(x * x + y * y + z * z)
    k = -MU / rn ** 3
    f = 1.5 * J2 * (RE / rn) ** 2
    zz = 5.0 * (z / rn) ** 2
    return np.stack([k * x * (1 + f * (1 - zz)), k * y * (1 + f * (1 - zz)), k * z * (1 + f * (3 - zz))], axis=1)


def deriv(s):
    return np.concatenate([s[:, 3:], accel(s[:, :3])], axis=1)


def main():
    r0 = RE + ALT
    v0 = np.sqrt(MU / r0)
    # Ascending node at x, velocity in the plane inclined by INC.
    s = np.zeros((2, 6))
    s[:, 0] = r0
    s[:, 4] = v0 * np.cos(INC)
    s[:, 5] = v0 * np.sin(INC)
    n = int(DAYS * 86400.0 / STEP)
    t = np.arange(n + 1) * STEP
    node = np.zeros((n + 1, 2))
    argl = np.zeros((n + 1, 2))
    sma = np.zeros((n + 1, 2))

    def record(k, s):
        r, v = s[:, :3], s[:, 3:]
        h = np.cross(r, v)
        om = np.arctan2(h[:, 0], -h[:, 1])
        inc = np.arctan2(np.hypot(h[:, 0], h[:, 1]), h[:, 2])
        node[k] = om
        # argument of latitude: angle from the node line to r in the orbit plane
        c = r[:, 0] * np.cos(om) + r[:, 1] * np.sin(om)
        sn = r[:, 2] / np.sin(inc)
        argl[k] = np.arctan2(sn, c)
        rn = np.linalg.norm(r, axis=1)
        sma[k] = 1.0 / (2.0 / rn - np.sum(v * v, axis=1) / MU)

    record(0, s)
    for k in range(1, n + 1):
        k1 = deriv(s)
        k2 = deriv(s + 0.5 * STEP * k1)
        k3 = deriv(s + 0.5 * STEP * k2)
        k4 = deriv(s + STEP * k3)
        s = s + STEP / 6.0 * (k1 + 2 * k2 + 2 * k3 + k4)
        record(k, s)
    days = t / 86400.0
    for j in range(2):
        om = np.degrees(np.unwrap(node[:, j]))
        u = np.degrees(np.unwrap(argl[:, j]))
        print(f"orbit {ALT[j]:.0f} km: mean a {sma[:, j].mean():.4f} km, node slope {np.polyfit(days, om, 1)[0]:.6f} "
              f"deg/day, u slope {np.polyfit(days, u, 1)[0]:.4f} deg/day, node short-period amplitude "
              f"{(om - np.polyval(np.polyfit(days, om, 1), days)).std() * np.sqrt(2):.5f} deg")


if __name__ == "__main__":
    main()
