#!/usr/bin/env python3
"""The double-layer rotary survey done with NumPy, for a side-by-side timing with
`beltwright survey` (see README, Performance). Same work: every slot count and even pole
count in the ranges, feasibility Z/(m*gcd(Z, p)) whole, the 60-degree belts of the star of
slots, and for every span 1..Z/2: k_w1, k_w5, k_w7, the content of orders 5, 7, 11, 13 and
the exact differential leakage sigma_d by Parseval on the MMF staircase. Then the span
`pitch` would recommend, the span of highest k_w1, the span of least sigma_d, the parallel
path counts and the lowest sub-harmonic. Vectorised over slots and spans; one Python loop
over combinations.

Usage: survey_numpy.py [ZMIN ZMAX PMIN PMAX] > rows.csv
"""

import math
import sys

import numpy as np

M = 3
ORDERS = np.array([1, 5, 7, 11, 13])
FLOOR = 0.9
BAND = (0.5, 1.5)


def row(z, poles):
    p = poles // 2
    t = math.gcd(z, p)
    if z % (M * t) != 0 or z < M:
        return None
    k = np.arange(z)
    a = (k * p) % z
    belt = np.minimum(2 * M * a // z, 2 * M - 1)
    positive = belt % 2 == 0
    phase = np.where(positive, belt // 2, ((belt + M) // 2) % M)
    sign = np.where(positive, 1.0, -1.0)
    c = sign * np.cos(2 * np.pi * phase / M)

    # Distribution factors from phase 1's belt sum.
    mine = phase == 0
    ang = 2 * np.pi * np.outer(ORDERS, a[mine]) / z
    kd = np.abs((sign[mine] * np.exp(-1j * ang)).sum(axis=1)) / (z / M)

    # Every span: pitch factors and winding factors.
    y = np.arange(1, z // 2 + 1)
    x = np.pi * p / z
    kw = kd[:, None] * np.abs(np.sin(np.outer(ORDERS, y) * x))
    kw1 = kw[0]
    with np.errstate(divide="ignore", invalid="ignore"):
        content = np.where(kw1 > 0, ((kw[1:] / kw1) ** 2).sum(axis=0), np.inf)

    # Exact sigma_d: the MMF of span-y coils is the cyclic window sum of the belt currents.
    cc = np.concatenate(([0.0], np.cumsum(np.concatenate((c, c)))))
    idx = k[None, :] + z + 1
    windows = cc[idx] - cc[idx - y[:, None]]
    ms = windows.var(axis=1)
    cp = np.abs((c * np.exp(-2j * np.pi * a / z)).sum())
    f = cp * np.abs(np.sin(y * x)) / (np.pi * p)
    working = 2 * f * f
    with np.errstate(divide="ignore", invalid="ignore"):
        sigma = np.where(working > 1e-300, np.maximum(ms / working - 1.0, 0.0), np.nan)

    tau = z / poles
    ratio = y / tau
    buildable = (y == 1) | ((ratio >= BAND[0] - 1e-12) & (ratio <= BAND[1] + 1e-12))
    cand = np.flatnonzero(buildable)
    # Ties within 1e-12 go to the shorter span, as in beltwright.
    hi = cand[np.flatnonzero(kw1[cand] > kw1[cand].max() - 1e-12)[0]]
    ok = cand[(kw1[cand] >= FLOOR - 1e-12) & (kw1[cand] > 0)]
    if ok.size:
        best = ok[0]
        for i in ok[1:]:
            d = content[i] - content[best]
            if d < -1e-9 or (abs(d) <= 1e-9 and kw1[i] > kw1[best] + 1e-12):
                best = i
    else:
        best = hi
    finite = cand[~np.isnan(sigma[cand])]
    calm = (finite[np.flatnonzero(sigma[finite] < sigma[finite].min() + 1e-12)[0]]
            if finite.size else None)

    units = 2 * t if (z // t) % 2 == 0 else t
    paths = [d for d in range(1, units + 1) if units % d == 0]
    yb = y[best]
    slot = c - np.roll(c, yb)
    ns = np.arange(t, p, t)
    sub = ""
    if ns.size:
        ref = np.abs((slot * np.exp(-2j * np.pi * ((p * k) % z) / z)).sum()) / p
        amp = np.abs(np.exp(-2j * np.pi * (np.outer(ns, k) % z) / z) @ slot) / ns
        found = ns[amp > 1e-9 * ref]
        if found.size:
            sub = f"{found[0] / p:.6g}"
    return (
        z,
        poles,
        int(yb),
        kw1[best],
        kw[1][best],
        kw[2][best],
        sigma[best],
        int(y[hi]),
        kw1[hi],
        int(y[calm]) if calm is not None else "",
        sigma[calm] if calm is not None else "",
        t,
        " ".join(map(str, paths)),
        sub,
        len(y),
    )


def main():
    zmin, zmax, pmin, pmax = (int(v) for v in (sys.argv[1:5] or (6, 360, 2, 96)))
    out = sys.stdout
    out.write("slots,poles,pitch,k_w1,k_w5,k_w7,sigma_d,max_pitch,max_kw1,"
              "calm_pitch,calm_sigma_d,t,paths,sub,spans\n")
    for z in range(zmin, zmax + 1):
        for poles in range(pmin + pmin % 2, pmax + 1, 2):
            r = row(z, poles)
            if r is None:
                continue
            out.write(",".join(f"{v:.12g}" if isinstance(v, float) else str(v) for v in r))
            out.write("\n")


if __name__ == "__main__":
    main()
