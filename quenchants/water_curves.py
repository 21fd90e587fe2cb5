#!/usr/bin/env python3
# SPDX-License-Identifier: Apache-2.0
"""The illustrative still-water curves water_30C, water_60C and water_80C.

Prints the rows of each curve, so that every number in those files can be
re-derived. The construction and the status of each figure (published,
from memory, computed, illustrative) are in docs/quenchants.md; in short:

- peak heat flux: the geometric mean of the saturated pool-boiling critical
  heat flux of water at 1 atm, 1.26 MW/m^2 (Incropera and DeWitt, Fundamentals
  of Heat and Mass Transfer, the boiling curve; from memory), and the same
  raised for the bath's subcooling by the correlation of Ivey and Morris
  (UKAEA report AEEW-R 137, 1962; from memory):
      q_sub / q_sat = 1 + 0.1 (rho_l / rho_v)^0.75 c_p,l dT_sub / h_fg;
- surface temperature of the peak: illustrative (200, 170, 150 degC); water-
  cooled aluminium surfaces peak near 160 degC in spray quenches (Kang, Zhao,
  Tian and Zhang, Trans. Nonferrous Met. Soc. China 28 (2018) 989);
- minimum film-boiling (rewetting) temperature: T_sat + 101 K + 8 dT_sub
  (Dhir and Purohit, Nucl. Eng. Des. 47 (1978) 49, spheres in subcooled
  water; from memory), above which h is the film-boiling value;
- film-boiling h: illustrative round figures rising with subcooling;
- transition boiling: log-linear in h between the film value at the minimum
  film-boiling temperature and the peak;
- nucleate boiling: log-linear in h from the onset at 105 degC to the peak;
- convection below 100 degC: Churchill and Chu's correlation for a horizontal
  cylinder (Int. J. Heat Mass Transfer 18 (1975) 1049) for a 25 mm bar, water
  properties at 50 degC (Incropera and DeWitt, table A.6; from memory).
"""
import math

T_SAT = 100.0  # degC, water at 1 atm
Q_SAT = 1.26e6  # W/m^2, saturated critical heat flux (Incropera and DeWitt; from memory)
RHO_L, RHO_V = 958.4, 0.5978  # kg/m^3 at 100 degC (from memory)
CP_L, H_FG = 4217.0, 2.257e6  # J/kg/K, J/kg at 100 degC (from memory)


def subcooled_chf(bath):
    """Ivey and Morris (1962; from memory)."""
    dt_sub = T_SAT - bath
    return Q_SAT * (1 + 0.1 * (RHO_L / RHO_V) ** 0.75 * CP_L * dt_sub / H_FG)


def natural_convection(surface, bath, diameter=0.025):
    """Churchill and Chu, horizontal cylinder; water at 50 degC (from memory)."""
    k, nu, alpha, beta, pr = 0.643, 0.556e-6, 0.155e-6, 4.6e-4, 3.56
    ra = 9.81 * beta * (surface - bath) * diameter**3 / (nu * alpha)
    nu_d = (0.6 + 0.387 * ra ** (1 / 6) / (1 + (0.559 / pr) ** (9 / 16)) ** (8 / 27)) ** 2
    return nu_d * k / diameter


def log_between(t, t0, h0, t1, h1):
    return math.exp(math.log(h0) + (math.log(h1) - math.log(h0)) * (t - t0) / (t1 - t0))


def curve(bath, t_peak, h_film):
    q_peak = math.sqrt(Q_SAT * subcooled_chf(bath))
    h_peak = q_peak / (t_peak - bath)
    t_min = T_SAT + 101.0 + 8.0 * (T_SAT - bath)  # Dhir and Purohit (from memory)
    rows = [(bath, natural_convection(bath + 5.0, bath))]
    for t in range(int(bath) // 10 * 10 + 10, 100, 10):
        if t >= bath + 10:
            rows.append((t, natural_convection(t, bath)))
    h_onb = natural_convection(100.0, bath)
    rows.append((105.0, h_onb))
    for t in [t_peak - 30, t_peak]:
        rows.append((t, log_between(t, 105.0, h_onb, t_peak, h_peak)))
    for t in range(int(t_peak) // 50 * 50 + 50, int(t_min), 50):
        rows.append((t, log_between(t, t_peak, h_peak, t_min, h_film)))
    rows += [(t_min, h_film), (900.0, h_film)]
    return q_peak, h_peak, t_min, rows


def two_digits(x):
    return float(f"{x:.2g}")


if __name__ == "__main__":
    for bath, t_peak, h_film in [(30.0, 200.0, 1000.0), (60.0, 170.0, 700.0),
                                 (80.0, 150.0, 450.0)]:
        q, h, t_min, rows = curve(bath, t_peak, h_film)
        print(f"# water {bath:.0f} degC: subcooled CHF {subcooled_chf(bath) / 1e6:.2f} MW/m^2, "
              f"peak flux {q / 1e6:.2f} MW/m^2, peak h {h / 1e3:.1f} kW/m^2/K at "
              f"{t_peak:.0f} degC, minimum film boiling {t_min:.0f} degC")
        for t, hh in rows:
            print(f'  - ["{t:g} degC", "{two_digits(hh / 1e3):g} kW/m^2/K"]')
