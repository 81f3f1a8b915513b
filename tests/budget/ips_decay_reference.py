#!/usr/bin/python3
"""Independent re-implementation of the lifetime method of IPS Radio and Space Services,
"Satellite Orbital Decay Calculations" (Australian Space Weather Agency, 1999, updated by R. Panwar):
density rho = 6e-10 exp(-(h - 175)/H), H = (900 + 2.5 (F10.7 - 70) + 1.5 Ap) / (27 - 0.012 (h - 200)) km,
period change dP/dt = -3 pi a rho (A/M), Euler steps of 0.1 day, decay ends when h < 180 km;
G = 6.67e-11, Earth mass 5.98e24 kg, Re = 6378 km as in that document.

Prints the lifetime in days for the cases used by tests/budget/decay_test.cpp. Run with /usr/bin/python3.
"""
import math

import numpy as np

GM = 6.67e-11 * 5.98e24  # m^3/s^2
RE = 6378.0e3            # m


def lifetime_days(h0_km, mass_to_area, f107, ap, dt_days=0.1):
    area_to_mass = 1.0 / mass_to_area
    r = RE + h0_km * 1e3
    period = 2.0 * math.pi * math.sqrt(r ** 3 / GM)
    t = 0.0
    h = h0_km
    dt_s = dt_days * 86400.0
    while h >= 180.0:
        scale = (900.0 + 2.5 * (f107 - 70.0) + 1.5 * ap) / (27.0 - 0.012 * (h - 200.0))
        rho = 6e-10 * math.exp(-(h - 175.0) / scale)
        period -= 3.0 * math.pi * area_to_mass * r * rho * dt_s
        t += dt_days
        r = (GM * period * period / (4.0 * math.pi ** 2)) ** (1.0 / 3.0)
        h = (r - RE) / 1e3
    return t


CASES = [(300.0, 100.0, 70.0, 0.0), (400.0, 100.0, 150.0, 15.0), (450.0, 50.0, 250.0, 25.0), (350.0, 200.0, 100.0, 5.0)]

if __name__ == "__main__":
    out = np.array([lifetime_days(*c) for c in CASES])
    for c, days in zip(CASES, out):
        print(f"h0 = {c[0]:.0f} km, M/A = {c[1]:.0f} kg/m^2, F10.7 = {c[2]:.0f}, Ap = {c[3]:.0f}: {days:.1f} days")
