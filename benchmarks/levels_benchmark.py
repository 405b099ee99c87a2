"""Level tables: speed and agreement, vertical beside numpy frusta, horizontal beside scipy quad.

Run:  python benchmarks/levels_benchmark.py [--levels N] [--baseline-levels M] [--no-quad]

Prints ratios, never absolute promises: the machines are shared and noisy.

Vertical (issue 10's target: within 50× of closed-form frusta for all levels at
once in numpy): a table of N levels by
:func:`revolve.geometry.clipping.vertical_levels` through the library (the
prepared profile in, the pieces split inside the call; best of five), next to
the plain numpy computation of the same wall's frusta for all levels (cumulative
frustum volumes and a partial frustum found by ``searchsorted``). The surveyed
wall is measured drawn as 1001 lines and as one polyline (an (n, 2) array), and
the corrugated wall of arcs for scale; the lines' volumes are compared with the
frusta.

Horizontal (target: 1000 levels on 1000 arcs under 0.15 s):

For each profile, a table of N levels (default 1000) from empty to full with
the axis horizontal, by :func:`revolve.geometry.horizontal.horizontal_levels`
(best of three runs), next to a baseline that integrates the wetted slice
area along the axis with one ``scipy.integrate.quad`` call per level (every
vertex given as a break point). The baseline is timed on M levels (default
8) spread over the table and scaled to N; both give the same volumes, whose
largest difference is printed relative to the capacity.

Profiles (each 1001 segments, invented test shapes):

* a surveyed horizontal tank: 999 straight pieces along a slightly wavy
  wall (lines only: the closed forms);
* a corrugated horizontal tank: 998 shallow arcs (the quadrature path);
* and, for scale, a 2:1 ellipsoidal-headed tank of four segments (curves).
"""

from __future__ import annotations

import argparse
import math
import sys
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from revolve.geometry.checks import prepare  # noqa: E402
from revolve.geometry.clipping import vertical_levels  # noqa: E402
from revolve.geometry.horizontal import horizontal_levels, horizontal_pieces  # noqa: E402
from revolve.geometry.measure import measure  # noqa: E402
from revolve.geometry.profile import Axis, Loop, Profile, Revolution  # noqa: E402
from revolve.geometry.segments import (Line, Polyline, arc_from_radius,  # noqa: E402
                                       curve_from_expressions)


def surveyed_wall(n=999, R=1000.0, L=4000.0):
    """The surveyed tank's wall points (z, r), monotone in z."""
    z = np.linspace(0.0, L, n + 1)
    r = R + 5.0 * np.sin(2 * np.pi * z / 500.0) + 2.0 * np.cos(2 * np.pi * z / 130.0)
    return z, r


def surveyed_tank(n=999, R=1000.0, L=4000.0):
    z, r = surveyed_wall(n, R, L)
    segs = [Line((0.0, 0.0), (0.0, float(r[0])))]
    segs += [Line((float(z[i]), float(r[i])), (float(z[i + 1]), float(r[i + 1])))
             for i in range(n)]
    segs += [Line((L, float(r[-1])), (L, 0.0)), Line((L, 0.0), (0.0, 0.0))]
    return Profile(loops=(Loop(tuple(segs)),))


def surveyed_polyline(n=999, R=1000.0, L=4000.0):
    """The surveyed tank as one closed polyline: (0, 0), the wall, (L, 0), back to (0, 0)."""
    z, r = surveyed_wall(n, R, L)
    pts = np.vstack([[0.0, 0.0], np.column_stack([z, r]), [L, 0.0], [0.0, 0.0]])
    return Profile(loops=(Loop((Polyline(pts),)),))


def corrugated_tank(n=998, R=1000.0, L=4000.0):
    z = np.linspace(0.0, L, n + 1)
    pitch = z[1] - z[0]
    segs = [Line((0.0, 0.0), (0.0, R))]
    segs += [arc_from_radius((float(z[i]), R), (float(z[i + 1]), R), radius=2 * pitch,
                             side="left") for i in range(n)]
    segs += [Line((L, R), (L, 0.0)), Line((L, 0.0), (0.0, 0.0))]
    return Profile(loops=(Loop(tuple(segs)),))


def ellipsoidal_tank(R=600.0, L=2400.0):
    import sympy

    t = sympy.Symbol("t", real=True)
    a = R / 2
    h1 = curve_from_expressions(-a * sympy.cos(t), R * sympy.sin(t), 0.0, math.pi / 2)
    h2 = curve_from_expressions(L + a * sympy.sin(t), R * sympy.cos(t), 0.0, math.pi / 2)
    return Profile(loops=(Loop((h1, Line((0.0, R), (L, R)), h2, Line((L + a, 0.0), (-a, 0.0)))),))


# -- the baseline: scipy quad of the wetted slice area, one call per level -------------------

def _segment_area(r, y):
    """CRC circular segment below the height y of a circle of radius r (arrays)."""
    h = np.clip(r + y, 0.0, 2 * r)
    with np.errstate(invalid="ignore", divide="ignore"):
        c = np.clip(np.where(r > 0, (r - h) / np.where(r > 0, r, 1.0), 1.0), -1.0, 1.0)
    return r * r * np.arccos(c) - (r - h) * np.sqrt(np.clip(2 * r * h - h * h, 0.0, None))


class SliceArea:
    """Σ ± S(r_i(z), y) over the pieces crossing the slice at z (lines and arcs).

    The pieces are split here, independently of the engine's level tables: lines as
    they are, arcs where z turns back (their angles 0 and π about the centre).
    """

    def __init__(self, prep):
        lines, arcs = [], []
        for segs, f in zip(prep.paths, prep.loop_factors):
            for seg in segs:
                if seg.kind == "line":
                    (z0, r0), (z1, r1) = seg.start, seg.end
                    if z0 != z1:
                        lines.append((z0, r0, z1, r1, f))
                elif seg.kind == "arc":
                    (cz, cr), R = seg.centre, seg.radius
                    a0, a1 = seg.angles()
                    lo, hi = min(a0, a1), max(a0, a1)
                    cuts = [k * math.pi for k in range(math.ceil(lo / math.pi),
                                                       math.floor(hi / math.pi) + 1)
                            if lo < k * math.pi < hi]
                    angles = [a0] + (cuts if a1 > a0 else cuts[::-1]) + [a1]
                    for p, q in zip(angles[:-1], angles[1:]):
                        side = 1.0 if math.sin(0.5 * (p + q)) >= 0 else -1.0
                        arcs.append((cz, cr, R, side, cz + R * math.cos(p), cz + R * math.cos(q), f))
                else:
                    raise ValueError("the baseline handles lines and arcs")
        self.lines = np.array(lines, dtype=float).reshape(-1, 5)
        self.arcs = np.array(arcs, dtype=float).reshape(-1, 7)
        ends = np.concatenate([self.lines[:, [0, 2]].ravel(), self.arcs[:, 4:6].ravel()])
        self.breaks = np.unique(ends)

    def __call__(self, z, y):
        total = 0.0
        if self.lines.size:
            z0, r0, z1, r1, f = self.lines.T
            m = (np.minimum(z0, z1) <= z) & (z <= np.maximum(z0, z1))
            r = r0[m] + (z - z0[m]) * (r1[m] - r0[m]) / (z1[m] - z0[m])
            d = np.sign(z1[m] - z0[m])
            total += float(np.sum(-d * f[m] * _segment_area(r, y)))
        if self.arcs.size:
            cz, cr, R, s, za, zb, f = self.arcs.T
            m = (np.minimum(za, zb) <= z) & (z <= np.maximum(za, zb))
            r = cr[m] + s[m] * np.sqrt(np.maximum(R[m] ** 2 - (z - cz[m]) ** 2, 0.0))
            d = np.sign(zb[m] - za[m])
            total += float(np.sum(-d * f[m] * _segment_area(r, y)))
        return total


def baseline(prep, depths, r_max):
    from scipy.integrate import quad

    area = SliceArea(prep)
    a, b = area.breaks[0], area.breaks[-1]
    inner = list(area.breaks[1:-1])
    out = []
    for d in depths:
        y = d - r_max
        v, _ = quad(lambda z: area(z, y), a, b, points=inner, limit=len(inner) + 200,
                    epsabs=0.0, epsrel=1e-10)
        out.append(abs(v))
    return np.array(out)


def frusta_all_levels(z, r, levels):
    """Volume below each level of a wall r(z) (z increasing): cumulative frusta in numpy."""
    dz = np.diff(z)
    cum = np.concatenate([[0.0], np.cumsum(np.pi * dz * (r[:-1] ** 2 + r[:-1] * r[1:] + r[1:] ** 2) / 3)])
    i = np.clip(np.searchsorted(z, levels, side="right") - 1, 0, z.size - 2)
    h = np.clip(levels - z[i], 0.0, dz[i])
    rc = r[i] + (r[i + 1] - r[i]) / dz[i] * h
    return cum[i] + np.pi * h * (r[i] ** 2 + r[i] * rc + rc ** 2) / 3


def vertical(levels: int) -> None:
    z, r = surveyed_wall()
    L = np.linspace(z[0], z[-1], levels)
    t_ref, ref = best_of(lambda: frusta_all_levels(z, r, L), 20)
    cap = float(ref[-1])
    print(f"vertical level tables, {levels} levels each; reference: numpy frusta for all levels "
          f"({t_ref * 1e3:.3f} ms); target ratio <= 50")
    print(f"{'profile':44s} {'revolve ms':>10s} {'ratio':>8s} {'max diff / capacity':>20s}")
    for name, prof, compare in (("surveyed tank, 1001 lines", surveyed_tank(), True),
                                ("surveyed tank, one 1003-point polyline", surveyed_polyline(), True),
                                ("corrugated tank, 998 arcs + 3 lines", corrugated_tank(), False)):
        prep = prepare(prof, Axis.x())
        try:
            t, res = best_of(lambda: vertical_levels(prep, L), 5)
        except TypeError as exc:   # a kind the code under test does not know
            print(f"{name:44s} {'—':>10s} {'—':>8s}   ({exc})")
            continue
        diff = f"{float(np.max(np.abs(res.volume - ref))) / cap:20.1e}" if compare else f"{'—':>20s}"
        print(f"{name:44s} {t * 1e3:10.2f} {t / t_ref:8.1f} {diff}")


def best_of(fn, repeats=3):
    best, out = math.inf, None
    for _ in range(repeats):
        t0 = time.perf_counter()
        out = fn()
        best = min(best, time.perf_counter() - t0)
    return best, out


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--levels", type=int, default=1000)
    ap.add_argument("--baseline-levels", type=int, default=8)
    ap.add_argument("--no-quad", action="store_true", help="skip the scipy quad baseline")
    args = ap.parse_args(argv)
    vertical(args.levels)
    print()
    cases = [("surveyed tank, 1001 lines", surveyed_tank(), True),
             ("corrugated tank, 998 arcs + 3 lines", corrugated_tank(), True),
             ("2:1 ellipsoidal tank, 4 segments (curves)", ellipsoidal_tank(), False)]
    print(f"horizontal level tables, {args.levels} levels each; baseline: scipy quad per level, "
          f"timed on {args.baseline_levels} levels and scaled")
    print(f"{'profile':44s} {'revolve s':>10s} {'quad s (scaled)':>16s} {'ratio':>8s} "
          f"{'max diff / capacity':>20s} {'error estimate':>15s} {'s / 0.15 s':>10s}")
    for name, prof, with_baseline in cases:
        prep = prepare(prof, Axis.x())
        cap = measure(Revolution(prof, Axis.x()), symbolic=False).volume
        pieces = horizontal_pieces(prep)
        depths = np.linspace(0.0, 2 * pieces.r_max, args.levels)

        def ours():
            return horizontal_levels(prep, depths, pieces=horizontal_pieces(prep))

        t_ours, res = best_of(ours)
        target = f"{t_ours / 0.15:10.2f}"
        if with_baseline and not args.no_quad:
            pick = np.linspace(1, args.levels - 2, args.baseline_levels).astype(int)
            t0 = time.perf_counter()
            ref = baseline(prep, depths[pick], pieces.r_max)
            t_base = (time.perf_counter() - t0) * args.levels / len(pick)
            diff = float(np.max(np.abs(res.volume[pick] - ref))) / cap
            print(f"{name:44s} {t_ours:10.3f} {t_base:16.1f} {t_base / t_ours:8.0f} "
                  f"{diff:20.1e} {float(res.error.max()) / cap:15.1e} {target}")
        else:
            print(f"{name:44s} {t_ours:10.3f} {'—':>16s} {'—':>8s} {'—':>20s} "
                  f"{float(res.error.max()) / cap:15.1e} {target}")
        last = abs(res.volume[-1] / cap - 1)
        mono = bool(np.all(np.diff(res.volume) >= 0))
        print(f"{'':44s} last row / capacity - 1 = {last:.1e}; monotonic: {mono}")


if __name__ == "__main__":
    main()
