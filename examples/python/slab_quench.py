#!/usr/bin/env python3
# SPDX-License-Identifier: Apache-2.0
"""A 1D quench with quantacal and numpy: a plate cooled on both faces by a fluid
through a heat-transfer coefficient h, solved by the method of lines in energy
form,

    V_i (E(T_i) - E(T_i,old)) / dt + F(i+1/2) - F(i-1/2) = -[i = n] h (T_n - T_fluid),
    F(i+1/2) = -(k_i + k_(i+1))/2 (T_(i+1) - T_i) / dx,

on the half thickness (symmetry at x = 0), vertex-centred finite volumes,
backward Euler with Newton on the consistent Jacobian (from dE/dT = rho c_p and
dk/dT). E is the stored energy per volume from the card's energy-consistent
table, so summed over the nodes the fluxes cancel and the stored energy changes
by exactly the heat through the face, whatever c_p(T) does inside a step. The
script checks that balance every step and over the run, plots the cooling curves
(matplotlib, Agg backend: no display needed) and exits non-zero if a check fails.

Every property call is one quantacal batch call over all nodes (no Python loop
over points).

Defaults (ILLUSTRATIVE, not a measured case): an aluminium plate 20 mm thick
from 520 degC (solution treatment) into water at 20 degC with a constant
h = 3000 W/m^2/K (a real quench has a boiling curve h(T_surface)), 60 s in
240 steps.

    python3 slab_quench.py [CARD] [--start K] [--fluid K] [--h W/m^2/K]
                           [--half-thickness m] [--end s] [--steps N]
                           [--cells N] [--plot FILE.png]
"""

import argparse
import os
import sys

import matplotlib

matplotlib.use("Agg")  # files only: works without a display
import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402

import quantacal  # noqa: E402

NEWTON_TOLERANCE = 1e-10  # K, largest update of a converged Newton solve
MAX_NEWTON = 30
BALANCE_TOLERANCE = 1e-10  # relative, per step and over the run
PROPERTIES = ["energy", "capacity", "conductivity", "conductivity_derivative"]


def arguments():
    here = os.path.dirname(os.path.abspath(__file__))
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("card", nargs="?",
                        default=os.path.join(here, "..", "..", "materials", "aluminium.yaml"))
    parser.add_argument("--start", type=float, default=793.15, help="K (illustrative)")
    parser.add_argument("--fluid", type=float, default=293.15, help="K (illustrative)")
    parser.add_argument("--h", type=float, default=3000.0, help="W/m^2/K (illustrative)")
    parser.add_argument("--half-thickness", type=float, default=0.01, help="m")
    parser.add_argument("--end", type=float, default=60.0, help="s")
    parser.add_argument("--steps", type=int, default=240)
    parser.add_argument("--cells", type=int, default=40)
    parser.add_argument("--plot", default="slab_quench.png", help="PNG file to write")
    return parser.parse_args()


def main():
    a = arguments()
    material = quantacal.load_card(a.card)
    stats = material.table_statistics
    print(f"{material.name}: table of {stats.n_segments} segments, worst c_p error "
          f"{stats.worst_error:.1e}; valid {material.valid_range[0]:g} K to "
          f"{material.valid_range[1]:g} K")

    n = a.cells
    dx = a.half_thickness / n
    dt = a.end / a.steps
    volume = np.full(n + 1, dx)  # per unit area of the face
    volume[[0, n]] = dx / 2

    def properties(t):
        """E (J/m^3), dE/dT, k, dk/dT at every node: one batch call."""
        p = material.evaluate(t, PROPERTIES, basis="volume")
        return p.energy, p.capacity, p.conductivity, p.conductivity_derivative

    def residual_and_jacobian(t, e, c, k, dk, e_old):
        r = volume * (e - e_old) / dt
        jac = np.diag(volume * c / dt)
        kf = (k[:-1] + k[1:]) / 2
        grad = (t[1:] - t[:-1]) / dx
        flux = -kf * grad  # F(i+1/2), W/m^2
        r[:-1] += flux
        r[1:] -= flux
        d_left = -dk[:-1] / 2 * grad + kf / dx  # dF/dT_i
        d_right = -dk[1:] / 2 * grad - kf / dx  # dF/dT_(i+1)
        i = np.arange(n)
        jac[i, i] += d_left
        jac[i, i + 1] += d_right
        jac[i + 1, i] -= d_left
        jac[i + 1, i + 1] -= d_right
        r[n] += a.h * (t[n] - a.fluid)
        jac[n, n] += a.h
        return r, jac

    t = np.full(n + 1, a.start)
    e, c, k, dk = properties(t)
    stored_start = np.sum(volume * e)
    times, centre, face = [0.0], [t[0]], [t[n]]
    heat_in = 0.0
    worst_step = 0.0
    newton_total = 0
    print("#  t (s)  T centre (K)  T face (K)  dE stored (J/m^2)  heat in (J/m^2)  step imbalance")
    for step in range(1, a.steps + 1):
        e_old = e
        t_new = t.copy()
        for _ in range(MAX_NEWTON):
            e, c, k, dk = properties(t_new)
            r, jac = residual_and_jacobian(t_new, e, c, k, dk, e_old)
            update = np.linalg.solve(jac, -r)
            t_new += update
            newton_total += 1
            if np.max(np.abs(update)) < NEWTON_TOLERANCE:
                break
        else:
            sys.exit(f"slab_quench: Newton did not converge in step {step}")
        t = t_new
        e, c, k, dk = properties(t)
        # the balance of this step: stored-energy change against the heat in through
        # the face at the new temperature (backward Euler), per unit area
        step_stored = np.sum(volume * (e - e_old))
        step_heat = -dt * a.h * (t[n] - a.fluid)
        imbalance = abs(step_stored - step_heat) / abs(step_heat)
        worst_step = max(worst_step, imbalance)
        heat_in += step_heat
        times.append(step * dt)
        centre.append(t[0])
        face.append(t[n])
        if step % max(1, a.steps // 10) == 0:
            print(f"{step * dt:8.1f} {t[0]:13.6f} {t[n]:11.6f} {np.sum(volume * e) - stored_start:18.10e}"
                  f" {heat_in:16.10e} {imbalance:14.2e}")

    stored_change = np.sum(volume * e) - stored_start
    whole_run = abs(stored_change - heat_in) / abs(heat_in)
    print(f"Newton iterations: {newton_total} ({newton_total / a.steps:.2f} per step)")
    print(f"energy balance: worst step {worst_step:.2e}, whole run {whole_run:.2e}")

    fig, ax = plt.subplots(figsize=(6.4, 4.0))
    ax.plot(times, np.array(centre) - 273.15, label="centre")
    ax.plot(times, np.array(face) - 273.15, "--", label="face")
    ax.axhline(a.fluid - 273.15, color="grey", lw=0.8, label="fluid")
    ax.set_xlabel("time (s)")
    ax.set_ylabel("temperature (degC)")
    ax.set_title(f"{material.name}, {2000 * a.half_thickness:g} mm plate, "
                 f"h = {a.h:g} W/m^2/K (illustrative)", fontsize=9)
    ax.legend()
    fig.tight_layout()
    fig.savefig(a.plot, dpi=100)
    print(f"cooling curves: {a.plot}")

    checks = [
        (worst_step < BALANCE_TOLERANCE, "every step's energy balance"),
        (whole_run < BALANCE_TOLERANCE, "the whole run's energy balance"),
        (np.all(t > a.fluid) and np.all(t < a.start), "temperatures between fluid and start"),
        (t[0] >= t[n], "the centre is the warmest point"),
        (np.all(np.diff(centre) < 0), "the centre cools in every step"),
        (os.path.getsize(a.plot) > 0, "the plot was written"),
    ]
    for ok, what in checks:
        print(("ok: " if ok else "check failed: ") + what)
    return 0 if all(ok for ok, _ in checks) else 1


if __name__ == "__main__":
    sys.exit(main())
