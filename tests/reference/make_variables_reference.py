#!/usr/bin/env python3
"""Independent reference values for lotsman's variables (measurement) plans.

Writes ``tests/data/variables_reference.json`` from first principles, using
only general-purpose numerical libraries: mpmath for every noncentral-t
probability, normal quantile and sigma-known quantity (25 to 50 significant
digits), scipy.special / scipy.stats / numpy in double precision for the
exhaustive design scans and for the centred two-limit OC of the sigma-unknown
case (a one-dimensional quadrature checked for convergence and, in
``--self-test``, against a 30-digit mpmath evaluation and Monte Carlo).
Nothing here comes from any acceptance-sampling package.  ``render``,
``to_float``, ``parse_args`` and ``write_or_check`` are imported from
``make_reference.py`` in this directory.

Usage (from the repository root)::

    python3 tests/reference/make_variables_reference.py             # (re)write the fixture
    python3 tests/reference/make_variables_reference.py --check     # exit 1 if it would change
    python3 tests/reference/make_variables_reference.py --bench     # print timings, write nothing
    python3 tests/reference/make_variables_reference.py --self-test # independent cross-checks

Conventions (mirrored by the Rust code):

* ``z_p = Phi^-1(1 - p)``; alpha, beta, p1, p2 and p are the exact binary64
  values of the inputs;
* noncentral t: ``T' = (Z + delta) / sqrt(V / nu)``; ``cdf = P(T' <= t)``,
  ``sf = P(T' > t)``, each summed separately;
* ``known-one``: ``Pa(p) = Phi(sqrt(n) (z_p - k))``; ``unknown-one``:
  ``Pa(p) = sf(k sqrt(n); n - 1, z_p sqrt(n))``;
* ``known-two``: sigma = 1, limits at -D and D, ``p_hat(xbar) = Phi(-v (D -
  xbar)) + Phi(-v (xbar + D))`` with ``v = sqrt(n / (n - 1))``, accept when
  ``p_hat <= M``; the lot mean mu >= 0 solves ``Phi(mu - D) + Phi(-mu - D) = p``;
* ``unknown-two``: ``p_hat_U = I_x(n/2 - 1, n/2 - 1)`` with ``x = clamp(1/2 -
  Q_U sqrt(n) / (2 (n - 1)), 0, 1)``, likewise ``p_hat_L``; accept when
  ``p_hat_U + p_hat_L <= M``; OC at every split of p between the tails, the
  design held to the worst split (the largest rejection at p1, the largest
  Pa at p2), found by a scan of the split and a bounded scalar refinement;
* every minimal n comes from an upward scan over every n from the smallest
  allowed one.

The output is deterministic: keys sorted, floats written with ``repr``, no
timestamps or versions in the data.
"""

from __future__ import annotations

import math
import multiprocessing
import statistics
import sys
import time
from concurrent.futures import ProcessPoolExecutor
from fractions import Fraction
from pathlib import Path

import mpmath
import numpy as np
import scipy
import scipy.integrate as si
import scipy.optimize as opt
import scipy.special as sps
import scipy.stats as st
from mpmath import mp, mpf
from numpy.polynomial.legendre import leggauss

sys.path.insert(0, str(Path(__file__).resolve().parent))
import make_reference as ref  # noqa: E402  (sets mp.dps = 50)
from make_reference import render, to_float  # noqa: E402

REPO = Path(__file__).resolve().parents[2]
FIXTURE = REPO / "tests" / "data" / "variables_reference.json"

assert mp.dps == ref.MP_DPS == 50

KNOWN_ONE, UNKNOWN_ONE, KNOWN_TWO, UNKNOWN_TWO = (
    "known-one", "unknown-one", "known-two", "unknown-two")

#: Significant digits kept by every noncentral-t evaluation.
NCT_DIGITS = 25
#: Relative width below which a design interval counts as a near tie.
NEAR_TIE = 1e-9
#: Relative margin inside which a double-precision feasibility decision of a
#: sigma-unknown one-limit design is re-taken with the mpmath noncentral t.
REDECIDE = 1e-7
#: Worker processes for the nct rows and the design scans.
WORKERS = 2
#: How far past the minimal n the feasibility scan goes (monotonicity check).
SCAN_PAST = 20


# --------------------------------------------------------------------------
# Noncentral t: Poisson mixture of incomplete beta functions, both tails
# --------------------------------------------------------------------------
#
# For t >= 0, x = t^2 / (t^2 + nu), y = nu / (t^2 + nu), b = nu / 2,
# lambda = delta^2 / 2, p_j = e^-lambda lambda^j / j!,
# q_j = delta e^-lambda lambda^j / (sqrt(2) Gamma(j + 3/2)):
#
#   P(T' <= t) = Phi(-delta) + 1/2 sum_j [p_j I_x(j + 1/2, b) + q_j I_x(j + 1, b)]
#   P(T' >  t) =               1/2 sum_j [p_j I_y(b, j + 1/2) + q_j I_y(b, j + 1)]
#
# (the second from the first with sum p_j = 1, sum q_j / 2 = Phi(delta) - 1/2).
# I_x(a, b) is summed downwards from the top of the Poisson window with
# I_x(a - 1, b) = I_x(a, b) + T_{a-1}, and I_y(b, a) upwards with
# I_y(b, a + 1) = I_y(b, a) + T_a, T_a = Gamma(a+b)/(Gamma(a+1)Gamma(b)) x^a y^b:
# both recurrences only add.  With delta < 0 the q_j are negative and the
# upper sum cancels; the working precision is raised until the digits lost
# (log10 of sum |terms| / |sum|) leave NCT_DIGITS + 10 good ones.  t < 0 goes
# through F(t; nu, delta) = 1 - F(-t; nu, -delta), i.e. the tails swap.


def _ibeta_series(a, b, x, y):
    """T_a * sum_k prod_{i<k} x (a+b+i)/(a+1+i) = I_x(a, b); all terms positive.

    T_a = Gamma(a+b) / (Gamma(a+1) Gamma(b)) x^a y^b, y = 1 - x passed separately.
    """
    if x == 0:
        return mpf(0)
    eps = mpf(2) ** (-mp.prec - 10)
    term = mpf(1)
    total = mpf(1)
    k = 0
    while True:
        r = x * (a + b + k) / (a + 1 + k)
        term *= r
        total += term
        k += 1
        if r < 1:
            R = max(r, x)
            if term * R / (1 - R) < eps * total:
                break
    logT = (mpmath.loggamma(a + b) - mpmath.loggamma(a + 1) - mpmath.loggamma(b)
            + a * mpmath.log(x) + b * mpmath.log(y))
    return mpmath.exp(logT) * total


def ibeta(a, b, x, y=None):
    """Regularised incomplete beta I_x(a, b) at the working precision.

    mpmath 1.3.0's betainc evaluates x^a 2F1(a, 1-b; a+1; x) / (a B(a, b)) for
    every argument, which cancels catastrophically for large b (it raises
    "hypsum() failed to converge" at b = 5000).  Here a series of positive
    terms is summed, for I_x(a, b) itself or for 1 - I_x(a, b) = I_y(b, a),
    whichever needs fewer terms; the complement is formed with 12 extra digits
    and only used when the result is > 1e-10, so at most 10 of them cancel.  ``y`` = 1 - x
    may be given separately to keep it exact.
    """
    a, b, x = mpf(a), mpf(b), mpf(x)
    y = 1 - x if y is None else mpf(y)
    if x <= 0:
        return mpf(0)
    if y <= 0:
        return mpf(1)
    if _ibeta_cost(a, b, x, y) <= _ibeta_cost(b, a, y, x):
        return _ibeta_series(a, b, x, y)
    with mp.workdps(mp.dps + 12):  # room for the digits the subtraction may lose
        v = 1 - _ibeta_series(b, a, y, x)
    return +v if v > 1e-10 else _ibeta_series(a, b, x, y)


def _ibeta_cost(a, b, x, y):
    """Rough number of terms _ibeta_series needs: rise to the peak term, its
    width, then the geometric tail with ratio x."""
    a, b, x, y = float(a), float(b), float(x), float(y)
    if x == 0:
        return 0.0
    if y == 0:
        return math.inf
    kp = max(0.0, (x * (a + b) - a - 1) / y)
    return kp + 15 * math.sqrt(x * (a + b + kp)) / y + 100 / max(-math.log(x), 1e-300)


def _nct_series(t, nu, d, dps, want):
    """Tails for t >= 0 at ``dps`` digits: (cdf, sf, sum |sf terms|)."""
    with mp.workdps(dps):
        t, nu, d = mpf(t), mpf(nu), mpf(d)
        eps = mpf(10) ** (-(dps + 5))
        b = nu / 2
        cdf = sf = A = None
        if t == 0:
            return mpmath.ncdf(-d), mpmath.ncdf(d), mpmath.ncdf(d)
        t2 = t * t
        x, y = t2 / (t2 + nu), nu / (t2 + nu)
        if d == 0:
            if want != "sf":
                cdf = mpf(0.5) + ibeta(mpf(0.5), b, x, y) / 2
            if want != "cdf":
                sf = A = ibeta(b, mpf(0.5), y, x) / 2
            return cdf, sf, A
        lam = d * d / 2
        lf = float(lam)
        l_lam, l_dq = mpmath.log(lam), mpmath.log(abs(d) / mpmath.sqrt(2))
        sgn = 1 if d > 0 else -1
        lx, ly, lgb = mpmath.log(x), mpmath.log(y), mpmath.loggamma(b)

        def logp(j):
            return -lam + j * l_lam - mpmath.loggamma(j + 1)

        def logq(j):
            return -lam + j * l_lam - mpmath.loggamma(mpf(j) + 1.5) + l_dq

        def logT(a):
            return mpmath.loggamma(a + b) - mpmath.loggamma(a + 1) - lgb + a * lx + b * ly

        # Poisson window [jlo, jhi]: both weights below eps * e^-5 outside it.
        leps = float(mpmath.log(eps)) - 5
        step = max(1, int(math.sqrt(lf + 1)))
        jhi = int(lf)
        while float(logp(jhi)) > leps or float(logq(jhi)) > leps:
            jhi += step
        jlo = int(lf)
        while jlo > 0 and (float(logp(jlo)) > leps or float(logq(jlo)) > leps):
            jlo = max(0, jlo - step)

        if want != "sf":
            a1, a2 = jhi + mpf(0.5), mpf(jhi + 1)
            I1 = ibeta(a1, b, x, y)
            I2 = ibeta(a2, b, x, y)
            T1, T2 = mpmath.exp(logT(a1 - 1)), mpmath.exp(logT(a2 - 1))
            p, q = mpmath.exp(logp(jhi)), sgn * mpmath.exp(logq(jhi))
            phi_m = mpmath.ncdf(-d)
            S = p * I1 + q * I2
            j = jhi
            while j > 0:
                I1 += T1
                I2 += T2
                a1 -= 1
                a2 -= 1
                p = p * j / lam
                q = q * (j + mpf(0.5)) / lam
                j -= 1
                if j > 0:
                    T1 = T1 * a1 / (x * (a1 - 1 + b))
                    T2 = T2 * a2 / (x * (a2 - 1 + b))
                S += p * I1 + q * I2
                # below the mode the weights fall geometrically (ratio j/lam)
                if j < lf / 2 and (p + abs(q)) * 2 < eps * abs(phi_m + S / 2):
                    break
            cdf = phi_m + S / 2
        if want != "cdf":
            a1, a2 = jlo + mpf(0.5), mpf(jlo + 1)
            J1 = ibeta(b, a1, y, x)
            J2 = ibeta(b, a2, y, x)
            T1, T2 = mpmath.exp(logT(a1)), mpmath.exp(logT(a2))
            p, q = mpmath.exp(logp(jlo)), sgn * mpmath.exp(logq(jlo))
            S = p * J1 + q * J2
            A = p * J1 + abs(q) * J2
            j = jlo
            while True:
                J1 += T1
                J2 += T2
                T1 = T1 * x * (a1 + b) / (a1 + 1)
                T2 = T2 * x * (a2 + b) / (a2 + 1)
                a1 += 1
                a2 += 1
                j += 1
                p = p * lam / j
                q = q * lam / (j + mpf(0.5))
                S += p * J1 + q * J2
                A += p * J1 + abs(q) * J2
                # above 2 lambda the weights fall geometrically (ratio <= 1/2)
                if j > 2 * lf + 1 and (p + abs(q)) * 2 < eps * A:
                    break
            sf, A = S / 2, A / 2
        return cdf, sf, A


def nct_tails(t, nu, delta, want="both", digits=NCT_DIGITS):
    """(P(T' <= t), P(T' > t)) as mpf, each to ``digits`` significant digits.

    ``want`` = "cdf" or "sf" computes only that tail (the other is None).
    """
    t = mpf(t)
    if t < 0:
        flip = {"cdf": "sf", "sf": "cdf", "both": "both"}[want]
        sf, cdf = nct_tails(-t, nu, -mpf(delta), flip, digits)
        return cdf, sf
    dps = digits + 15
    while True:
        cdf, sf, A = _nct_series(t, nu, delta, dps, want)
        if sf is None:
            return cdf, sf
        lost = dps if sf == 0 else max(0.0, float(mpmath.log10(A / abs(sf))))
        if dps - lost >= digits + 10:
            return cdf, sf
        dps = int(lost) + digits + 25


def nct_quantile(prob, nu, delta, tail, x0):
    """q with cdf(q) = prob (tail "cdf") or sf(q) = prob (tail "sf"), by secant."""
    idx = 0 if tail == "cdf" else 1
    target = mpf(prob)

    def f(q):
        return nct_tails(q, nu, delta, tail)[idx] - target

    q0, q1 = mpf(x0), mpf(x0) * (1 + mpf(10) ** -9) + mpf(10) ** -12
    f0, f1 = f(q0), f(q1)
    for _ in range(60):
        q2 = q1 - f1 * (q1 - q0) / (f1 - f0)
        if abs(q2 - q1) <= mpf(10) ** -(NCT_DIGITS - 3) * max(abs(q2), 1):
            return q2
        q0, f0, q1, f1 = q1, f1, q2, f(q2)
    raise RuntimeError(f"nct quantile did not converge: {prob} {nu} {delta}")


# --------------------------------------------------------------------------
# The nct rows: (nu, delta) grid, 4 values of t each
# --------------------------------------------------------------------------

NCT_DF = (1, 2, 4, 9, 29, 99, 999, 9999)
NCT_DELTA = (-40.0, -12.0, -2.5, 0.0, 0.7, 3.0, 12.0, 25.0, 40.0)

#: t per (nu, delta): the 1e-3, 0.5 and 1 - 1e-6 quantiles (6 significant
#: digits), then a far-tail point (4 digits) found once by a root search on
#: log10 of our own tail, alternately in the lower and the upper tail, aiming at
#: 1e-300 or 1e-30 and capped at |t| = 1e30 (where a cap bites the row's tiny
#: tail is whatever the cap gives, e.g. 1e-259 for nu = 9, delta = -12).
NCT_T = {
    (1, -40.0): (-1e+30, -31915.4, -59.2957, -8.11584),
    (1, -12.0): (-9574.61, -17.7631, -2.24009, -0.2904),
    (1, -2.5): (-1e+30, -1996.31, -3.57305, 1599.07),
    (1, 0.0): (-318.309, 0.0, 318310.0, 3.17e+29),
    (1, 0.7): (-1.139e+29, -113.999, 0.903639, 672520.0),
    (1, 3.0): (-0.123033, 4.33468, 2393960.0, 1e+30),
    (1, 12.0): (0.2904, 3.50705, 17.7631, 9574610.0),
    (1, 25.0): (7.53147, 37.0516, 19947100.0, 1e+30),
    (1, 40.0): (0.4057, 12.1149, 59.2957, 31915400.0),
    (2, -40.0): (-1264.99, -48.0391, -10.6717, -4.602),
    (2, -12.0): (-1.204e+16, -380.691, -14.3944, -2.91605),
    (2, -2.5): (-85.1077, -2.93451, 34.6248, 34630000000000.0),
    (2, 0.0): (-707100000000000.0, -22.3271, 0.0, 707.106),
    (2, 0.7): (-11.8705, 0.795143, 1161.06, 1161000000000000.0),
    (2, 3.0): (-14260000000000.0, -0.105891, 3.54058, 3162.24),
    (2, 12.0): (4.3587, 14.3944, 12041.6, 1.204e+16),
    (2, 25.0): (2.658, 9.41405, 30.0188, 25020.0),
    (2, 40.0): (15.1581, 48.0391, 40012.5, 4.001e+16),
    (4, -40.0): (-1506000000.0, -265.725, -43.6602, -13.7154),
    (4, -12.0): (-80.4402, -13.0839, -3.69618, -0.4176),
    (4, -2.5): (-112300000.0, -19.7341, -2.6907, 6.71641),
    (4, 0.0): (-7.17318, 0.0, 41.5779, 41620000.0),
    (4, 0.7): (-27720000.0, -4.67544, 0.745809, 58.5335),
    (4, 3.0): (-0.0978005, 3.23669, 128.848, 128900000.0),
    (4, 12.0): (0.4176, 5.28016, 13.0839, 455.805),
    (4, 25.0): (11.4907, 27.2829, 942.177, 942400000.0),
    (4, 40.0): (6.3, 18.5262, 43.6602, 1505.29),
    (9, -40.0): (-112.044, -41.5411, -17.7194, -1.115),
    (9, -12.0): (-1e+30, -34.3128, -12.4503, -4.66545),
    (9, -2.5): (-9.48794, -2.57713, 3.34541, 1789.0),
    (9, 0.0): (-5149.0, -4.29681, 0.0, 10.7202),
    (9, 0.7): (-3.10475, 0.719873, 13.5434, 1e+30),
    (9, 3.0): (-1e+30, -0.093514, 3.09499, 24.5607),
    (9, 12.0): (6.34559, 12.4503, 77.2917, 36280.0),
    (9, 25.0): (5.076, 13.9787, 25.959, 157.905),
    (9, 40.0): (22.5865, 41.5411, 251.708, 1e+30),
    (29, -40.0): (-1361000000000.0, -65.3306, -40.4617, -23.6246),
    (29, -12.0): (-20.5357, -12.1296, -5.91118, -0.5084),
    (29, -2.5): (-80.66, -6.55476, -2.52237, 2.5087),
    (29, 0.0): (-3.39624, 0.0, 5.91711, 108900000000.0),
    (29, 0.7): (-95080000000.0, -2.57634, 0.706077, 6.99133),
    (29, 3.0): (-0.0912347, 3.02718, 10.844, 86.76),
    (29, 12.0): (0.5084, 7.61421, 12.1296, 28.7116),
    (29, 25.0): (17.2092, 25.2849, 56.9172, 861700000000.0),
    (29, 40.0): (1.733, 27.9451, 40.4617, 90.1364),
    (99, -40.0): (-51.468, -40.1315, -28.8475, -19.37),
    (99, -12.0): (-44.87, -16.774, -12.0347, -6.72695),
    (99, -2.5): (-5.85496, -2.50639, 2.3223, 7897.0),
    (99, 0.0): (-10330.0, -3.1746, 0.0, 5.05197),
    (99, 0.7): (-2.44195, 0.701771, 5.84528, 18.02),
    (99, 3.0): (-11.17, -0.0905244, 3.0077, 8.53717),
    (99, 12.0): (8.40683, 12.0347, 20.0634, 25760.0),
    (99, 25.0): (-98.22, 19.6546, 25.0794, 38.1498),
    (99, 40.0): (32.188, 40.1315, 59.7114, 125.3),
    (999, -40.0): (-58.47, -44.3482, -40.0115, -34.0133),
    (999, -12.0): (-15.2682, -12.0031, -7.18701, 32.49),
    (999, -2.5): (-59.37, -5.61586, -2.50063, 2.26005),
    (999, 0.0): (-3.09841, 0.0, 4.78164, 11.85),
    (999, 0.7): (-11.1, -2.39526, 0.700175, 5.49037),
    (999, 3.0): (-0.0902612, 3.00075, 7.82727, 60.4),
    (999, 12.0): (-32.49, 8.85175, 12.0031, 17.0892),
    (999, 25.0): (21.5713, 25.0068, 30.7597, 40.23),
    (999, 40.0): (26.59, 36.03, 40.0115, 46.8528),
    (9999, -40.0): (-43.2322, -40.001, -35.1028, -2.945),
    (9999, -12.0): (-51.35, -15.1082, -12.0003, -7.24053),
    (9999, -2.5): (-5.59279, -2.50006, 2.25408, 8.987),
    (9999, 0.0): (-11.5, -3.09105, 0.0, 4.75623),
    (9999, 0.7): (-2.39073, 0.700018, 5.4571, 39.11),
    (9999, 3.0): (-35.15, -0.0902352, 3.00008, 7.76077),
    (9999, 12.0): (8.90387, 12.0003, 16.7872, 23.62),
    (9999, 25.0): (13.48, 21.8735, 25.0006, 29.8587),
    (9999, 40.0): (36.8076, 40.001, 44.9885, 82.67),
}


# --------------------------------------------------------------------------
# Normal quantiles
# --------------------------------------------------------------------------


def z_upper(p):
    """z_p = Phi^-1(1 - p) at 50 digits, p taken as its exact binary64 value."""
    return -mpmath.sqrt(2) * mpmath.erfinv(2 * mpf(p) - 1)


def zf(p):
    """z_p in double precision."""
    return float(st.norm.isf(p))


# --------------------------------------------------------------------------
# Design points
# --------------------------------------------------------------------------

#: (p1, alpha, p2, beta, D for known-two)
DESIGN_POINTS = (
    (0.01, 0.05, 0.06, 0.10, 2.6),
    (0.01, 0.05, 0.05, 0.10, 3.0),
    (0.001, 0.05, 0.01, 0.10, 3.5),
    (0.002, 0.05, 0.01, 0.10, 4.0),
    (0.005, 0.05, 0.02, 0.10, 3.0),
    (0.01, 0.05, 0.02, 0.10, 5.0),
    (0.02, 0.05, 0.08, 0.10, 2.6),
    (0.025, 0.10, 0.10, 0.05, 3.5),
    (0.04, 0.10, 0.15, 0.20, 2.6),
    (0.04, 0.05, 0.08, 0.10, 8.0),
    (0.005, 0.10, 0.03, 0.20, 4.0),
    (0.001, 0.01, 0.01, 0.05, 5.0),
    (0.03, 0.01, 0.06, 0.05, 3.0),
    (0.015, 0.025, 0.04, 0.10, 8.0),
    (0.01, 0.05, 0.015, 0.10, 3.5),
)


def _rel_width(lo, hi):
    return (hi - lo) / max(abs(lo), abs(hi))


def _monotone_note(kind, point, feas, n_min, notes):
    """Record whether feasibility stays true from n_min to n_min + SCAN_PAST."""
    bad = [n for n in range(n_min + 1, n_min + SCAN_PAST + 1) if not feas[n]]
    if bad:
        notes.append(f"NON-MONOTONE {kind} {point}: n = {n_min} feasible but "
                     f"not n = {bad}")
    return bad


# ---- (a) sigma known, one limit -----------------------------------------


def design_known_one(p1, alpha, p2, beta, notes):
    z1, z2, za, zb = (z_upper(v) for v in (p1, p2, alpha, beta))
    feas, n, n_min = {}, 1, None
    while n_min is None or n <= n_min + SCAN_PAST:
        feas[n] = (z1 - z2) * mpmath.sqrt(n) >= za + zb
        if feas[n] and n_min is None:
            n_min = n
        n += 1
    _monotone_note(KNOWN_ONE, (p1, alpha, p2, beta), feas, n_min, notes)
    rn = mpmath.sqrt(n_min)
    lo, hi = z2 + zb / rn, z1 - za / rn
    return n_min, (lo, hi)


def pa_known_one(n, k, p):
    return mpmath.ncdf(mpmath.sqrt(n) * (z_upper(p) - mpf(k)))


# ---- (b) sigma unknown, one limit ---------------------------------------


def k_interval_double(n, p1, alpha, p2, beta):
    """(k_lo, k_hi) of the s method at n from scipy's noncentral t (double)."""
    rn, nu = math.sqrt(n), n - 1
    k_hi = st.nct.ppf(alpha, nu, zf(p1) * rn) / rn
    k_lo = st.nct.isf(beta, nu, zf(p2) * rn) / rn
    return float(k_lo), float(k_hi)


def k_interval_mp(n, p1, alpha, p2, beta, start=None):
    """(k_lo, k_hi) at n from the mpmath noncentral t."""
    rn, nu = mpmath.sqrt(n), n - 1
    if start is None:
        start = k_interval_double(n, p1, alpha, p2, beta)
    q_lo = nct_quantile(alpha, nu, z_upper(p1) * rn, "cdf", start[1] * math.sqrt(n))
    q_hi = nct_quantile(beta, nu, z_upper(p2) * rn, "sf", start[0] * math.sqrt(n))
    return q_hi / rn, q_lo / rn


class OneSidedScan:
    """Feasibility of the s method for every n >= 2 (shared with unknown-two)."""

    def __init__(self, p1, alpha, p2, beta, notes):
        self.pt = (p1, alpha, p2, beta)
        self.notes = notes
        self.cache = {}
        self.redecided = 0

    def interval(self, n):
        """(k_lo, k_hi, exact) with exact=True when taken with mpmath."""
        if n not in self.cache:
            lo, hi = k_interval_double(n, *self.pt)
            exact = False
            if abs(_rel_width(lo, hi)) < REDECIDE:
                lo, hi = k_interval_mp(n, *self.pt, start=(lo, hi))
                exact = True
                self.redecided += 1
            self.cache[n] = (lo, hi, exact)
        return self.cache[n]

    def feasible(self, n):
        lo, hi, _ = self.interval(n)
        return lo <= hi


def design_unknown_one(p1, alpha, p2, beta, notes, scan=None):
    scan = scan or OneSidedScan(p1, alpha, p2, beta, notes)
    feas, n, n_min = {}, 2, None
    while n_min is None or n <= n_min + SCAN_PAST:
        feas[n] = scan.feasible(n)
        if feas[n] and n_min is None:
            n_min = n
        n += 1
        if n > 100000:
            raise RuntimeError("unknown-one scan runaway")
    _monotone_note(UNKNOWN_ONE, (p1, alpha, p2, beta), feas, n_min, notes)
    lo, hi = k_interval_mp(n_min, p1, alpha, p2, beta)
    if not lo <= hi:
        raise RuntimeError("mpmath disagrees with the scan at n_min")
    lo_p, hi_p = k_interval_mp(n_min - 1, p1, alpha, p2, beta) if n_min > 2 else (1, 0)
    if lo_p <= hi_p:
        raise RuntimeError("mpmath finds n_min - 1 feasible")
    z1, z2, za, zb = (z_upper(v) for v in (p1, p2, alpha, beta))
    k0 = (z1 * zb + z2 * za) / (za + zb)
    n_approx = (1 + k0 * k0 / 2) * ((za + zb) / (z1 - z2)) ** 2
    return n_min, (lo, hi), n_approx


def pa_unknown_one(n, k, p):
    rn = mpmath.sqrt(n)
    return nct_tails(mpf(k) * rn, n - 1, z_upper(p) * rn, "sf")[1]


# ---- (c) sigma known, two limits ----------------------------------------


def mu_of_p_double(p, D):
    f = lambda m: sps.ndtr(m - D) + sps.ndtr(-m - D) - p  # noqa: E731
    return opt.brentq(f, 0.0, D + 40.0, xtol=1e-15, rtol=1e-15)


def mu_of_p_mp(p, D):
    """mu >= 0 with Phi(mu - D) + Phi(-mu - D) = p (50 digits)."""
    D, p = mpf(D), mpf(p)
    f = lambda m: mpmath.ncdf(m - D) + mpmath.ncdf(-m - D) - p  # noqa: E731
    m0 = mpf(mu_of_p_double(float(p), float(D)))
    return mpmath.findroot(f, m0)


def phat_known(h, n, D):
    v = mpmath.sqrt(mpf(n) / (n - 1))
    return mpmath.ncdf(-v * (D - h)) + mpmath.ncdf(-v * (h + D))


def _h_targets_double(n, mu1, mu2, alpha, beta):
    rn = math.sqrt(n)
    f1 = lambda h: sps.ndtr(rn * (mu1 - h)) + sps.ndtr(-rn * (h + mu1)) - alpha  # noqa: E731
    f2 = lambda h: sps.ndtr(rn * (h - mu2)) - sps.ndtr(-rn * (h + mu2)) - beta  # noqa: E731
    top1, top2 = mu1 + 40 / rn, mu2 + 40 / rn
    h1 = opt.brentq(f1, 0.0, top1, xtol=1e-15, rtol=1e-15)
    h2 = opt.brentq(f2, 0.0, top2, xtol=1e-15, rtol=1e-15)
    return h1, h2


def _h_targets_mp(n, mu1, mu2, alpha, beta, start):
    rn = mpmath.sqrt(n)
    a, b = mpf(alpha), mpf(beta)
    f1 = lambda h: mpmath.ncdf(rn * (mu1 - h)) + mpmath.ncdf(-rn * (h + mu1)) - a  # noqa: E731
    f2 = lambda h: mpmath.ncdf(rn * (h - mu2)) - mpmath.ncdf(-rn * (h + mu2)) - b  # noqa: E731
    return mpmath.findroot(f1, mpf(start[0])), mpmath.findroot(f2, mpf(start[1]))


def design_known_two(p1, alpha, p2, beta, D, notes):
    """Minimal n >= 2 and [M_lo, M_hi]: Pa(p1) >= 1 - alpha, Pa(p2) <= beta."""
    assert 2 * st.norm.cdf(-D) < p1
    mu1d, mu2d = mu_of_p_double(p1, D), mu_of_p_double(p2, D)
    mu1, mu2 = mu_of_p_mp(p1, D), mu_of_p_mp(p2, D)
    feas, n, n_min = {}, 2, None
    hd = {}
    while n_min is None or n <= n_min + SCAN_PAST:
        h1, h2 = _h_targets_double(n, mu1d, mu2d, alpha, beta)
        if abs(_rel_width(h1, h2)) < REDECIDE:
            h1, h2 = _h_targets_mp(n, mu1, mu2, alpha, beta, (h1, h2))
        hd[n] = (h1, h2)
        feas[n] = h1 <= h2
        if feas[n] and n_min is None:
            n_min = n
        n += 1
    _monotone_note(KNOWN_TWO, (p1, alpha, p2, beta, D), feas, n_min, notes)
    res = {}
    for m in (n_min - 1, n_min):
        if m < 2:
            continue
        h1, h2 = _h_targets_mp(m, mu1, mu2, alpha, beta, hd[m])
        res[m] = (h1, h2)
    if not res[n_min][0] <= res[n_min][1] or (n_min - 1 in res and
                                              res[n_min - 1][0] <= res[n_min - 1][1]):
        raise RuntimeError("mpmath disagrees with the known-two scan")
    h1, h2 = res[n_min]
    return n_min, (phat_known(h1, n_min, mpf(D)), phat_known(h2, n_min, mpf(D)))


def pa_known_two(n, M, D, p):
    """Pa at lot quality p for the sigma-known two-limit plan (n, M), 50 digits."""
    D, M = mpf(D), mpf(M)
    if phat_known(0, n, D) > M:
        return mpf(0)
    h0 = mpf(opt.brentq(lambda h: float(phat_known(h, n, D) - M), 0.0, float(D) + 40))
    h = mpmath.findroot(lambda h: phat_known(h, n, D) - M, h0)
    mu = mu_of_p_mp(p, D)
    rn = mpmath.sqrt(n)
    return mpmath.ncdf(rn * (h - mu)) - mpmath.ncdf(-rn * (h + mu))


# ---- (d) sigma unknown, two limits --------------------------------------
#
# Centred configuration (sigma = 1, mu = 0, limits at m0 -+ c; m0 = 0 is the
# centred case, m0 != 0 the split checks).  With r = sqrt(n) / (2 (n-1) s),
# y_U = 1/2 - (c - d) r and y_L = 1/2 - (c + d) r at xbar = m0 + d, and
# F = I(.; a, a), a = n/2 - 1, the statistic g(d) = F(y_U) + F(y_L) is even in
# d and, for n >= 4, nondecreasing in |d| (the Beta(a, a) density is unimodal),
# so {g <= M} = [m0 - h(s), m0 + h(s)].  Writing x_M = F^-1(M):
#
#   s <= s*  = sqrt(n) c / ((n-1)(1 - x_M)):   p_hat_L = 0 at the root and
#            h(s) = c - (1/2 - x_M) / r (closed form);
#   s* < s < s_e = sqrt(n) c / ((n-1)(1 - 2 F^-1(M/2))):  both estimates
#            positive, h from a bracketed Newton iteration in h^2;
#   s >= s_e: g(0) >= M, the set is empty.
#
# Pa = E_s[Phi(sqrt(n)(m0 + h)) - Phi(sqrt(n)(m0 - h))], s ~ chi_{n-1}/sqrt(n-1),
# by composite Gauss-Legendre on [s_lo, s*] and, through a smoothstep map
# that removes the (s - s*)^a and (s_e - s)^(1/2) end behaviour, on [s*, s_e];
# s_lo, s_hi are the 1e-20 and 1 - 1e-20 points of the s distribution.
# n = 3 (a = 1/2) is different: g falls and then rises in |d| and the set can
# be two intervals; pa_two_n3 handles it.

_GL = {}


def _composite(a, b, panels, nodes):
    if nodes not in _GL:
        _GL[nodes] = leggauss(nodes)
    x, w = _GL[nodes]
    edges = np.linspace(a, b, panels + 1)
    lo, hi = edges[:-1, None], edges[1:, None]
    return (((lo + hi) / 2 + (hi - lo) / 2 * x[None, :]).ravel(),
            ((hi - lo) / 2 * w[None, :]).ravel())


def _log_sdens(s, nu):
    return (math.log(2) + (nu / 2) * math.log(nu / 2) - math.lgamma(nu / 2)
            + (nu - 1) * np.log(s) - nu * s * s / 2)


def _beta_pdf_sym(y, a):
    yc = np.clip(y, 1e-300, 1 - 1e-16)
    return np.exp((a - 1) * np.log(yc * (1 - yc)) - (2 * math.lgamma(a) - math.lgamma(2 * a)))


def _solve_h(c, r, M, a, hA):
    """Root h in [0, hA] of F(1/2 - (c-h) r) + F(1/2 - (c+h) r) = M (vectorised)."""
    lo, hi = np.zeros_like(hA), hA * hA

    def G(eta):
        h = np.sqrt(eta)
        yu = np.clip(0.5 - (c - h) * r, 0.0, 1.0)
        yl = np.clip(0.5 - (c + h) * r, 0.0, 1.0)
        return sps.betainc(a, a, yu) + sps.betainc(a, a, yl) - M, h, yu, yl

    g0, g1 = G(lo)[0], G(hi)[0]
    # Mathematically g(0) <= M <= g(hA); at the ends of [s*, s_e] rounding can
    # flip a sign, and the root is then the end itself.
    pinned = (g1 <= 0) | (g0 >= 0)
    pin_val = np.where(g1 <= 0, hi, 0.0)
    with np.errstate(divide="ignore", invalid="ignore"):
        eta = np.where(g1 > g0, hi * (-g0) / (g1 - g0), hi / 2)
    eta = np.where(pinned, pin_val, eta)
    for it in range(200):
        g, h, yu, yl = G(eta)
        g = np.where(pinned, 0.0, g)
        lo = np.where(g <= 0, eta, lo)
        hi = np.where(g > 0, eta, hi)
        fu = np.where((yu > 0) & (yu < 1), _beta_pdf_sym(yu, a), 0.0)
        fl = np.where((yl > 0) & (yl < 1), _beta_pdf_sym(yl, a), 0.0)
        with np.errstate(divide="ignore", invalid="ignore"):
            new = eta - g / (r * (fu - fl) / (2 * np.maximum(h, 1e-300)))
        # after 20 Newton steps, plain bisection (Newton can cycle on rounding noise)
        bad = ~np.isfinite(new) | (new < lo) | (new > hi) | (it >= 20)
        new = np.where(bad, (lo + hi) / 2, new)
        # stop at the rounding level of g (where g is flat in h, near s_e, it is
        # about 5e-15 M: the same as moving M by 1e-14 relative) or of eta
        narrow = hi - lo <= 1e-12 * hi
        done = (np.abs(g) <= 1e-14 * M) | narrow \
            | ((np.abs(new - eta) <= 4e-15 * np.maximum(eta, 1e-300)) & ~bad)
        eta = np.where(done, np.where(narrow & (np.abs(g) > 1e-14 * M), (lo + hi) / 2, eta),
                       new)
        if done.all():
            return np.sqrt(eta)
    raise RuntimeError("h root did not converge")


def pa_two(n, M, c, m0=0.0, panels=4, nodes=32):
    """P(p_hat_U + p_hat_L <= M), sigma = 1, mu = 0, limits m0 -+ c (double)."""
    if n == 3:
        return pa_two_n3(M, c, m0)
    if not 0 < M < 1:
        raise ValueError("M must lie in (0, 1)")
    nu, a, rn = n - 1, n / 2 - 1, math.sqrt(n)
    xM, xM2 = sps.betaincinv(a, a, M), sps.betaincinv(a, a, M / 2)
    s_lo = math.sqrt(st.chi2.ppf(1e-20, nu) / nu)
    s_hi = math.sqrt(st.chi2.isf(1e-20, nu) / nu)
    s_e = rn * c / (nu * (1 - 2 * xM2))
    s_st = min(rn * c / (nu * (1 - xM)), s_e)

    def K(h):
        return sps.ndtr(rn * (m0 + h)) - sps.ndtr(rn * (m0 - h))

    total = 0.0
    top = min(s_st, s_hi)
    if top > s_lo:
        s, w = _composite(s_lo, top, panels, nodes)
        hA = c - (0.5 - xM) * 2 * nu * s / rn
        total += float(np.sum(w * np.exp(_log_sdens(s, nu)) * K(hA)))
    b_lo, b_hi = max(s_st, s_lo), min(s_e, s_hi)
    if b_hi > b_lo:
        u, w = _composite(0.0, 1.0, panels, nodes)
        L = b_hi - b_lo
        s = b_lo + L * u * u * (3 - 2 * u)
        jac = 6 * L * u * (1 - u)
        r = rn / (2 * nu * s)
        h = _solve_h(c, r, M, a, c - (0.5 - xM) / r)
        total += float(np.sum(w * jac * np.exp(_log_sdens(s, nu)) * K(h)))
    return total


def pa_two_n3(M, c, m0=0.0):
    """n = 3 (a = 1/2, F(y) = 2 asin(sqrt y) / pi): the exact acceptance set.

    For d = |xbar - m0| >= 0 and 1/2 - c r > 0, g falls on [0, d1], d1 = 1/(2r) - c
    (p_hat_L reaches 0 there), from g(0) = 2 F(1/2 - c r) to F(1 - 2 c r), then
    rises as F(y_U).  {g <= M} is [0, hA] when M >= g(0), [d_low, hA] when
    F(1 - 2 c r) <= M < g(0), empty below; with 1/2 - c r <= 0, g(0) = 0 and
    the set is [0, hA].  hA solves F(y_U) = M.
    """
    n, nu, rn = 3, 2, math.sqrt(3)
    F = lambda y: 2 / math.pi * math.asin(math.sqrt(min(max(y, 0.0), 1.0)))  # noqa: E731
    xM = math.sin(math.pi * M / 2) ** 2

    def K(h):
        return sps.ndtr(rn * (m0 + h)) - sps.ndtr(rn * (m0 - h))

    def inner(s):
        r = rn / (2 * nu * s)
        hA = c - (0.5 - xM) / r
        if 0.5 - c * r <= 0:
            return K(max(hA, 0.0))
        d1 = 1 / (2 * r) - c
        g0, gmin = 2 * F(0.5 - c * r), F(1 - 2 * c * r)
        if M < gmin:
            return 0.0
        if M >= g0:
            return K(hA)
        g = lambda d: F(0.5 - (c - d) * r) + F(0.5 - (c + d) * r) - M  # noqa: E731
        d_low = opt.brentq(g, 0.0, d1, xtol=1e-15, rtol=1e-15)
        return K(hA) - K(d_low)

    # s = sqrt(V / 2), V ~ chi^2_2: density 2 s exp(-s^2).  Regime boundaries
    # (r = sqrt(3) / (4 s)): c r = 1/2, g(0) = M and F(1 - 2 c r) = M.
    r_b = (1 / (2 * c), (0.5 - math.sin(math.pi * M / 4) ** 2) / c, (1 - xM) / (2 * c))
    edges = [0.0] + sorted({rn / (4 * r) for r in r_b if r > 0}) + [np.inf]
    tot = 0.0
    for lo, hi in zip(edges[:-1], edges[1:]):
        tot += si.quad(lambda s: 2 * s * math.exp(-s * s) * inner(s), lo, hi,
                       limit=400, epsabs=1e-16, epsrel=1e-13)[0]
    return tot


def m_of_k(n, k):
    """M = I_x(a, a) at x = clamp(1/2 - k sqrt(n) / (2 (n-1))) (mpmath)."""
    a = mpf(n) / 2 - 1
    x = mpf(0.5) - mpf(k) * mpmath.sqrt(n) / (2 * (n - 1))
    x = min(max(x, mpf(0)), mpf(1))
    return ibeta(a, a, x)


def m_of_k_double(n, k):
    a = n / 2 - 1
    x = min(max(0.5 - k * math.sqrt(n) / (2 * (n - 1)), 0.0), 1.0)
    return float(sps.betainc(a, a, x))


def k_of_m(n, M):
    """k_M = (1 - 2 x_M)(n - 1)/sqrt(n), I_{x_M}(a, a) = M (mpmath)."""
    a = mpf(n) / 2 - 1
    M = mpf(M)
    x0 = mpf(float(sps.betaincinv(float(a), float(a), float(M))))
    xM = mpmath.findroot(lambda x: ibeta(a, a, x) - M, x0)
    return (1 - 2 * xM) * (n - 1) / mpmath.sqrt(n)


def pa_two_one(n, M, p):
    """One-sided configuration: sf(k_M sqrt(n); n - 1, z_p sqrt(n)) (mpmath)."""
    return pa_unknown_one(n, k_of_m(n, M), p)


def _m_root_centred(n, p, target, guess, nodes=32):
    """M with Pa_centred(p; M) = target (double), bracketed around ``guess``."""
    c = zf(p / 2)
    f = lambda M: pa_two(n, M, c, nodes=nodes) - target  # noqa: E731
    step = 1e-3
    lo, hi = guess * (1 - step), min(guess * (1 + step), (guess + 1) / 2)
    flo, fhi = f(lo), f(hi)
    while flo > 0:
        step *= 4
        hi, fhi = lo, flo
        lo = guess * max(1 - step, 1e-3)
        flo = f(lo)
    while fhi < 0:
        step *= 4
        lo, flo = hi, fhi
        hi = min(guess * (1 + step), (hi + 1) / 2)
        fhi = f(hi)
    return opt.brentq(f, lo, hi, xtol=1e-18, rtol=1e-15)


#: Shares w of p beyond the upper limit scanned for the worst split (w and
#: 1 - w give the same Pa by symmetry): even steps over [0.5, 0.95], then
#: geometric steps towards the one-sided end w -> 1.
WORST_SCAN = tuple(float(w) for w in np.concatenate(
    [np.linspace(0.5, 0.95, 19), 1 - np.geomspace(0.05, 1e-4, 12)[1:]]))


def worst_split(n, M, p, lowest):
    """The split of p with the lowest (producer) or highest (consumer) Pa.

    A brute scan over WORST_SCAN, a bounded scalar search between the worst
    point's neighbours, and the one-sided end (mpmath noncentral t) compared
    with both.  Returns (share beyond the lower limit, Pa): share 0 is the
    one-sided end, 1/2 the centred process.
    """
    sign = 1.0 if lowest else -1.0
    vals = [sign * pa_split(n, M, p, w) for w in WORST_SCAN]
    i = int(np.argmin(vals))
    lo = WORST_SCAN[max(i - 1, 0)]
    hi = WORST_SCAN[i + 1] if i + 1 < len(WORST_SCAN) else 1 - 1e-7
    r = opt.minimize_scalar(lambda w: sign * pa_split(n, M, p, w), bounds=(lo, hi),
                            method="bounded", options=dict(xatol=1e-7))
    best = min([(vals[i], WORST_SCAN[i]), (float(r.fun), float(r.x))])
    one = sign * float(pa_two_one(n, M, p))
    if one <= best[0]:
        return 0.0, sign * one
    return 1.0 - best[1], sign * best[0]


def _m_root_worst(n, p, target, lowest, start):
    """M with the worst-split Pa(p; M) = target (Pa rises with M), from ``start``."""
    f = lambda M: worst_split(n, M, p, lowest)[1] - target  # noqa: E731
    lo, hi = start * (1 - 1e-3), start * (1 + 1e-3)
    flo, fhi = f(lo), f(hi)
    while flo > 0:
        lo, flo = lo * 0.97, f(lo * 0.97)
    while fhi < 0:
        hi, fhi = min(hi * 1.03, (hi + 0.5) / 2), f(min(hi * 1.03, (hi + 0.5) / 2))
    return opt.brentq(f, lo, hi, xtol=1e-17, rtol=1e-13)


def design_unknown_two(p1, alpha, p2, beta, notes, scan):
    """Smallest n >= 3 with an M meeting both points in both configurations."""
    # Each n is decided from the definition; the cheap tests first.  With
    # M_lo = max(M_lo_one, M_lo_centred), M_hi = min(M_hi_one, M_hi_centred)
    # and Pa increasing in M: infeasible if the one-sided interval is empty,
    # if Pa_centred(p1; M_hi_one) < 1 - alpha or if Pa_centred(p2; M_lo_one) > beta;
    # otherwise feasible iff Pa_centred(p1; min(M_hi_one, M_hi_centred)) >= 1 - alpha.
    feas, n, n_min, info = {}, 3, None, {}
    c1, c2 = zf(p1 / 2), zf(p2 / 2)
    guess = None
    while n_min is None or n <= n_min + SCAN_PAST:
        k_lo, k_hi, _ = scan.interval(n)
        ok = k_lo <= k_hi and k_lo < (n - 1) / math.sqrt(n)
        if ok:
            if n == 3:
                raise RuntimeError("n = 3 reached the centred check")
            m_lo1 = m_of_k_double(n, k_hi)
            m_hi1 = m_of_k_double(n, k_lo)
            ok = (pa_two(n, m_hi1, c1, nodes=24) >= 1 - alpha
                  and pa_two(n, m_lo1, c2, nodes=24) <= beta)
        if ok:
            m_hi2 = _m_root_centred(n, p2, beta, guess or m_hi1, nodes=24)
            guess = m_hi2
            m_hi = min(m_hi1, m_hi2)
            ok = m_lo1 <= m_hi and pa_two(n, m_hi, c1, nodes=24) >= 1 - alpha
        feas[n] = ok
        if ok and n_min is None:
            n_min = n
        n += 1
    _monotone_note(UNKNOWN_TWO, (p1, alpha, p2, beta), feas, n_min, notes)
    # The scan above holds the plan to the one-sided and centred
    # configurations, which the worst split includes: its n is a lower
    # bound.  From there each n is decided at the worst split.
    n = n_min
    while True:
        k_lo, k_hi = k_interval_mp(n, p1, alpha, p2, beta)
        m_lo1, m_hi1 = m_of_k(n, k_hi), m_of_k(n, k_lo)
        m_lo2 = _m_root_worst(n, p1, 1 - alpha, True, float(m_lo1))
        m_hi2 = _m_root_worst(n, p2, beta, False, float(m_hi1))
        lo = m_lo1 if m_lo1 >= m_lo2 else mpf(m_lo2)
        hi = m_hi1 if m_hi1 <= m_hi2 else mpf(m_hi2)
        if lo <= hi:
            break
        notes.append(f"unknown-two {(p1, alpha, p2, beta)}: n {n} feasible in both "
                     f"configurations, not at the worst split")
        n += 1
    binding = ("one" if m_lo1 >= m_lo2 else "split", "one" if m_hi1 <= m_hi2 else "split")
    split = [worst_split(n, float(lo), p1, True)[0], worst_split(n, float(hi), p2, False)[0]]
    return n, (lo, hi), (m_lo1, m_hi1), (m_lo2, m_hi2), binding, split


# --------------------------------------------------------------------------
# Fixture sections
# --------------------------------------------------------------------------


def _nct_pair_rows(pair):
    nu, d = pair
    rows = []
    for t in NCT_T[(nu, d)]:
        cdf, sf = nct_tails(t, nu, d)
        s = cdf + sf - 1
        if abs(s) > mpf(10) ** -(NCT_DIGITS - 2):
            raise RuntimeError(f"nct tails do not add up to 1: {nu} {d} {t} {s}")
        rows.append(dict(df=nu, delta=d, t=t, cdf=to_float(cdf), sf=to_float(sf)))
    return rows


def _pool():
    """Two worker processes (the results do not depend on the split)."""
    return ProcessPoolExecutor(max_workers=WORKERS, mp_context=multiprocessing.get_context("fork"))


NCT_PAIRS = [(nu, d) for nu in NCT_DF for d in NCT_DELTA]


def build_nct(notes, pair_rows):
    """The nct rows (computed per (nu, delta) by _nct_pair_rows) and the scipy check."""
    rows = [r for pr in pair_rows for r in pr]
    worst, checked, tiny_bad = (0.0, None), 0, []
    for row in rows:
        nu, d, t = row["df"], row["delta"], row["t"]
        for name in ("cdf", "sf"):
            mine = row[name]
            sp = float(getattr(st.nct, name)(t, nu, d))
            if sp > 1e-12:
                rel = abs(sp - mine) / mine
                checked += 1
                if rel > worst[0]:
                    worst = (rel, (nu, d, t, name))
                if rel >= 1e-6:
                    raise RuntimeError(f"scipy nct {name} differs by {rel:.2e} "
                                       f"at nu={nu} delta={d} t={t}")
            elif mine > 1e-300 and not (0.01 < sp / mine < 100):
                tiny_bad.append((nu, d, t, name, sp, mine))
    notes.append(f"nct: {len(rows)} rows; scipy {scipy.__version__} nct.cdf/sf checked on "
                 f"{checked} values > 1e-12, largest relative difference {worst[0]:.2e} at "
                 f"(nu, delta, t, tail) = {worst[1]}")
    notes.append(f"nct: scipy values <= 1e-12 off by more than a factor 100 (or nan/0): "
                 f"{len(tiny_bad)}: {tiny_bad}")
    return rows


def _interval(lo, hi):
    return [to_float(lo), to_float(hi)]


def _design_rows(point):
    """The four designs of one point: (rows, notes, cache entries)."""
    p1, alpha, p2, beta, D = point
    notes, cache, rows = [], {}, []
    base = dict(half_width=None, n_approx=None, n_known=None, range_one=None,
                range_split=None, binding=None, split=None)
    pt = dict(p1=p1, alpha=alpha, p2=p2, beta=beta)
    n_a, (lo, hi) = design_known_one(p1, alpha, p2, beta, notes)
    rows.append(dict(base, kind=KNOWN_ONE, n=n_a, range=_interval(lo, hi),
                     near_tie=_rel_width(lo, hi) < NEAR_TIE, **pt))
    cache[(KNOWN_ONE, p1, alpha, p2, beta)] = (n_a, (lo, hi))

    scan = OneSidedScan(p1, alpha, p2, beta, notes)
    n_b, (lo, hi), n_approx = design_unknown_one(p1, alpha, p2, beta, notes, scan)
    rows.append(dict(base, kind=UNKNOWN_ONE, n=n_b, range=_interval(lo, hi),
                     near_tie=_rel_width(lo, hi) < NEAR_TIE, n_approx=to_float(n_approx),
                     n_known=n_a, **pt))
    cache[(UNKNOWN_ONE, p1, alpha, p2, beta)] = (n_b, (lo, hi))

    n_c, (lo, hi) = design_known_two(p1, alpha, p2, beta, D, notes)
    rows.append(dict(base, kind=KNOWN_TWO, n=n_c, range=_interval(lo, hi), half_width=D,
                     near_tie=_rel_width(lo, hi) < NEAR_TIE, **pt))
    cache[(KNOWN_TWO, p1, alpha, p2, beta)] = (n_c, (lo, hi), D)

    n_d, (lo, hi), one, worst, binding, split = design_unknown_two(
        p1, alpha, p2, beta, notes, scan)
    rows.append(dict(base, kind=UNKNOWN_TWO, n=n_d, range=_interval(lo, hi),
                     near_tie=_rel_width(lo, hi) < NEAR_TIE, range_one=_interval(*one),
                     range_split=[float(worst[0]), float(worst[1])], binding=list(binding),
                     split=split, **pt))
    cache[(UNKNOWN_TWO, p1, alpha, p2, beta)] = (n_d, (lo, hi))
    if scan.redecided:
        notes.append(f"one-sided scan {pt}: {scan.redecided} n re-decided with mpmath")
    notes.append(f"designs {pt}: n = {n_a} / {n_b} / {n_c} (D {D}) / {n_d}, "
                 f"n_approx {float(n_approx):.2f}, unknown-two binding {binding}, "
                 f"feasibility monotone to n + {SCAN_PAST} unless noted")
    return rows, notes, cache


#: Risks at the end of double precision (issue 14, item 4), sigma known,
#: one limit: 1 - alpha rounds to 1 in double precision below about 1e-16,
#: and the interval of k here is taken from the upper quantiles at 50 digits.
EXTREME_POINTS = (
    (0.01, 5e-17, 0.10, 0.10),
    (0.01, 1e-30, 0.10, 1e-30),
    (0.001, 1e-30, 0.01, 5e-17),
)


def build_extreme_designs(notes):
    """Sigma-known, one-limit designs for EXTREME_POINTS: the exact smallest
    n and the interval of k at it (design_known_one, at 50 digits)."""
    rows = []
    for p1, alpha, p2, beta in EXTREME_POINTS:
        n, (lo, hi) = design_known_one(p1, alpha, p2, beta, notes)
        rows.append(dict(kind=KNOWN_ONE, p1=p1, alpha=alpha, p2=p2, beta=beta, n=n,
                         range=_interval(lo, hi), near_tie=_rel_width(lo, hi) < NEAR_TIE,
                         half_width=None, n_approx=None, n_known=None, range_one=None,
                         range_split=None, binding=None, split=None))
    return rows


def build_designs(notes, cache, results):
    """Assemble the design rows from _design_rows(point) for every point."""
    rows = []
    for r, nt, c in results:
        rows += r
        notes += nt
        cache.update(c)
    return rows


#: indices into DESIGN_POINTS used for the OC rows, per kind
OC_DESIGNS = {KNOWN_ONE: (0, 5, 14), UNKNOWN_ONE: (0, 5, 14),
              KNOWN_TWO: (5, 9, 12), UNKNOWN_TWO: (0, 8, 9)}


def _mid(lo, hi):
    return to_float((mpf(lo) + mpf(hi)) / 2)


def build_oc(cache):
    rows = []
    blank = dict(k=None, m=None, half_width=None, pa=None, pa_one=None, pa_centred=None)
    for kind, idxs in OC_DESIGNS.items():
        for i in idxs:
            p1, alpha, p2, beta, _ = DESIGN_POINTS[i]
            entry = cache[(kind, p1, alpha, p2, beta)]
            n, (lo, hi) = entry[0], entry[1]
            par = _mid(lo, hi)
            for p in (p1 / 4, p1, p2, 3 * p2):
                row = dict(blank, kind=kind, n=n, p=p)
                if kind == KNOWN_ONE:
                    row.update(k=par, pa=to_float(pa_known_one(n, par, p)))
                elif kind == UNKNOWN_ONE:
                    row.update(k=par, pa=to_float(pa_unknown_one(n, par, p)))
                elif kind == KNOWN_TWO:
                    D = entry[2]
                    assert p > 2 * st.norm.cdf(-D)
                    row.update(m=par, half_width=D, pa=to_float(pa_known_two(n, par, D, p)))
                else:
                    row.update(m=par, pa_one=to_float(pa_two_one(n, par, p)),
                               pa_centred=pa_two(n, par, zf(p / 2)))
                rows.append(row)
    # n = 3, where {p_hat_U + p_hat_L <= M} need not be an interval
    for M, p in ((0.1, 0.05), (0.3, 0.2)):
        rows.append(dict(blank, kind=UNKNOWN_TWO, n=3, p=p, m=M,
                         pa_one=to_float(pa_two_one(3, M, p)), pa_centred=pa_two(3, M, zf(p / 2))))
    return rows


SPLIT_W = (0.55, 0.6, 0.75, 0.9, 0.99)


def pa_split(n, M, p, w):
    """Pa with a fraction w of p above U and 1 - w below L (sigma = 1, mu = 0)."""
    zu, zl = zf(w * p), zf((1 - w) * p)
    return pa_two(n, M, (zu + zl) / 2, (zu - zl) / 2)


def build_split(notes, cache):
    cases = []
    for i in (0, 5, 8, 9):
        p1, alpha, p2, beta, _ = DESIGN_POINTS[i]
        n, (lo, hi) = cache[(UNKNOWN_TWO, p1, alpha, p2, beta)]
        M = _mid(lo, hi)
        cases += [(n, M, p1), (n, M, p2)]
    cases += [(4, 0.1, 0.01), (4, 0.1, 0.1), (6, 0.08, 0.01), (6, 0.08, 0.1)]
    rows, outside = [], []
    for n, M, p in cases:
        one = to_float(pa_two_one(n, M, p))
        cen = pa_two(n, M, zf(p / 2))
        for w in SPLIT_W:
            pa = pa_split(n, M, p, w)
            rows.append(dict(n=n, m=M, p=p, w=w, pa=pa, pa_one=one, pa_centred=cen))
            if not min(one, cen) - 1e-12 <= pa <= max(one, cen) + 1e-12:
                outside.append((n, M, p, w, pa, one, cen))
    notes.append(f"split_check: {len(rows)} rows, {len(outside)} outside "
                 f"[min, max](one, centred)" + (f": {outside}" if outside else ""))
    return rows


def build_worst_split(cache):
    """The worst split at the unknown-two OC plans and a few small samples."""
    cases = []
    for i in OC_DESIGNS[UNKNOWN_TWO]:
        p1, alpha, p2, beta, _ = DESIGN_POINTS[i]
        n, (lo, hi) = cache[(UNKNOWN_TWO, p1, alpha, p2, beta)]
        M = _mid(lo, hi)
        cases += [(n, M, p1), (n, M, p2)]
    cases += [(4, 0.1, 0.01), (6, 0.08, 0.1), (12, 0.05, 0.02), (18, 0.0878, 0.04)]
    rows = []
    for n, M, p in cases:
        for lowest in (True, False):
            share, pa = worst_split(n, M, p, lowest)
            rows.append(dict(n=n, m=M, p=p, worst="lowest" if lowest else "highest",
                             share=share, pa=pa))
    return rows


# ---- estimators on fixed samples ----------------------------------------

#: (n, mean, sd, lower, upper) of the generating normal, limits, and the sigma
#: given to the sigma-known rows (the generating sd)
MVU_CASES = (
    (3, 10.0, 1.0, 9.5, 10.2),
    (4, 10.0, 0.5, None, 10.2),
    (5, 0.0, 1.0, -2.0, None),
    (6, 12.0, 1.0, None, 11.0),
    (8, 50.0, 2.0, 47.0, 52.5),
    (10, 0.52, 0.01, 0.5, 0.55),
    (15, 100.0, 3.0, None, 106.0),
    (20, 5.0, 0.2, 4.3, 5.9),
    (25, 1.0, 0.1, 0.5, 1.5),
    (30, 20.0, 1.0, None, 20.5),
    (40, 0.0, 1.0, -2.5, 2.0),
)
MVU_SEED = 20240611


def mvu_samples():
    rng = np.random.default_rng(MVU_SEED)
    return [[round(float(v), 4) for v in rng.normal(mu, sd, n)]
            for n, mu, sd, _, _ in MVU_CASES]


def mvu_row(x, lower, upper, sigma):
    n = len(x)
    fr = [Fraction(v) for v in x]
    mean_f = sum(fr) / n
    var_f = sum((v - mean_f) ** 2 for v in fr) / (n - 1)
    mean = mpf(mean_f.numerator) / mean_f.denominator
    s = mpmath.sqrt(mpf(var_f.numerator) / var_f.denominator)
    sd = s if sigma is None else mpf(sigma)
    a = mpf(n) / 2 - 1
    out = dict(x=x, n=n, lower=lower, upper=upper, sigma=sigma, mean=to_float(mean),
               s=to_float(s), q_upper=None, q_lower=None, p_upper=None, p_lower=None)

    def est(q):
        if sigma is not None:
            return mpmath.ncdf(-mpmath.sqrt(mpf(n) / (n - 1)) * q)
        xq = mpf(0.5) - q * mpmath.sqrt(n) / (2 * (n - 1))
        xq = min(max(xq, mpf(0)), mpf(1))
        return ibeta(a, a, xq)

    total = mpf(0)
    if upper is not None:
        q = (mpf(upper) - mean) / sd
        pu = est(q)
        total += pu
        out.update(q_upper=to_float(q), p_upper=to_float(pu))
    if lower is not None:
        q = (mean - mpf(lower)) / sd
        pl = est(q)
        total += pl
        out.update(q_lower=to_float(q), p_lower=to_float(pl))
    out["p_total"] = to_float(total)
    return out


def build_mvu():
    rows = []
    for x, (n, mu, sd, lo, up) in zip(mvu_samples(), MVU_CASES):
        rows.append(mvu_row(x, lo, up, sd))
        rows.append(mvu_row(x, lo, up, None))
    return rows


# ---- Anderson-Darling ----------------------------------------------------

AD_SEED = 19861986
AD_CASES = (("normal", 8), ("normal", 20), ("normal", 50), ("exponential", 15),
            ("exponential", 40), ("uniform", 12), ("uniform", 30), ("bimodal", 25),
            ("bimodal", 50), ("lognormal", 20), ("normal", 35))


def ad_samples():
    rng = np.random.default_rng(AD_SEED)
    out = []
    for kind, n in AD_CASES:
        if kind == "normal":
            v = rng.normal(10.0, 2.0, n)
        elif kind == "exponential":
            v = rng.exponential(1.0, n)
        elif kind == "uniform":
            v = rng.uniform(0.0, 1.0, n)
        elif kind == "bimodal":
            v = np.where(rng.uniform(size=n) < 0.5, -2.5, 2.5) + rng.normal(0.0, 1.0, n)
        else:
            v = rng.lognormal(0.0, 1.0, n)
        out.append([round(float(t), 4) for t in v])
    return out


def ad_pvalue(A):
    """D'Agostino & Stephens (1986) Table 4.9, A = A*^2 (mpmath, exact decimals)."""
    A = mpf(A)
    c = lambda s: mpf(s)  # noqa: E731  (decimal strings: exact to 50 digits)
    if A >= c("0.6"):
        return mpmath.exp(c("1.2937") - c("5.709") * A + c("0.0186") * A * A)
    if A >= c("0.34"):
        return mpmath.exp(c("0.9177") - c("4.279") * A - c("1.38") * A * A)
    if A >= c("0.2"):
        return 1 - mpmath.exp(c("-8.318") + c("42.796") * A - c("59.938") * A * A)
    return 1 - mpmath.exp(c("-13.436") + c("101.14") * A - c("223.73") * A * A)


def ad_statistic_mp(x):
    n = len(x)
    fr = sorted(Fraction(v) for v in x)
    mean_f = sum(fr) / n
    var_f = sum((v - mean_f) ** 2 for v in fr) / (n - 1)
    mean = mpf(mean_f.numerator) / mean_f.denominator
    s = mpmath.sqrt(mpf(var_f.numerator) / var_f.denominator)
    z = [(mpf(v.numerator) / v.denominator - mean) / s for v in fr]
    tot = sum((2 * i + 1) * (mpmath.log(mpmath.ncdf(z[i])) + mpmath.log(mpmath.ncdf(-z[n - 1 - i])))
              for i in range(n))
    return -n - tot / n


def build_anderson(notes):
    rows, worst = [], 0.0
    for x, (kind, n) in zip(ad_samples(), AD_CASES):
        a2 = float(st.anderson(np.array(x), "norm", method="interpolate").statistic)
        worst = max(worst, float(abs(ad_statistic_mp(x) - mpf(a2)) / mpf(a2)))
        a2s = mpf(a2) * (1 + mpf(0.75) / n + mpf(2.25) / (n * n))
        a2s_f = to_float(a2s)
        rows.append(dict(x=x, n=n, source=kind, a2=a2, a2_star=a2s_f,
                         p_value=to_float(ad_pvalue(a2s_f))))
    notes.append(f"anderson: scipy statistic vs 50-digit A^2 (n - 1 divisor): largest "
                 f"relative difference {worst:.2e}")
    if worst > 1e-12:
        raise RuntimeError("scipy anderson statistic disagrees with the mpmath one")
    return rows


def build_fixture(notes, timings):
    cache = {}
    out = {}
    t = time.perf_counter()
    # The expensive parts (the 72 (nu, delta) pairs and the 15 design points)
    # run in WORKERS processes, slowest first; results are put back in order.
    jobs = [("design", i) for i in sorted(range(len(DESIGN_POINTS)), key=lambda i: i != 14)]
    jobs += [("nct", i) for i in sorted(range(len(NCT_PAIRS)), key=lambda i: -(
        math.log(NCT_PAIRS[i][0]) + abs(NCT_PAIRS[i][1]) / 10))]
    with _pool() as ex:
        futs = {job: ex.submit(_run_job, job) for job in jobs}
        res = {job: f.result() for job, f in futs.items()}
    timings["nct + designs (parallel)"] = time.perf_counter() - t
    out["nct"] = build_nct(notes, [res[("nct", i)] for i in range(len(NCT_PAIRS))])
    out["designs"] = build_designs(notes, cache,
                                   [res[("design", i)] for i in range(len(DESIGN_POINTS))])
    for name, fn in (("oc", lambda: build_oc(cache)),
                     ("split_check", lambda: build_split(notes, cache)),
                     ("worst_split", lambda: build_worst_split(cache)),
                     ("mvu", build_mvu),
                     ("anderson", lambda: build_anderson(notes)),
                     ("extreme_designs", lambda: build_extreme_designs(notes))):
        t = time.perf_counter()
        out[name] = fn()
        timings[name] = time.perf_counter() - t
    return out


def _run_job(job):
    kind, i = job
    return _design_rows(DESIGN_POINTS[i]) if kind == "design" else _nct_pair_rows(NCT_PAIRS[i])


# --------------------------------------------------------------------------
# Self-test: independent methods
# --------------------------------------------------------------------------


def _chi_mixture_tails(t, nu, delta, dps=30):
    """P(T' <= t) = E_s[Phi(t s - delta)], P(T' > t) = E_s[Phi(delta - t s)] by
    mpmath.quad over u = log s (s = sqrt(V / nu)), split around the peak of each
    integrand (found by bisection on the derivative).  Used only here, to check
    the series."""
    with mp.workdps(dps):
        t, nu, d = mpf(t), mpf(nu), mpf(delta)
        lc = mpmath.log(2) + (nu / 2) * mpmath.log(nu / 2) - mpmath.loggamma(nu / 2)
        out = []
        for sign in (1, -1):  # cdf: Phi(t s - d); sf: Phi(d - t s)
            def logf(u, sign=sign):
                s = mpmath.exp(u)
                base = lc + nu * u - nu * s * s / 2
                if base < -10 ** 6:
                    return -mpmath.inf
                return base + mpmath.log(mpmath.ncdf(sign * (t * s - d)))

            def dlogf(u, sign=sign):
                s = mpmath.exp(u)
                w = sign * (t * s - d)
                return nu - nu * s * s + sign * t * s * mpmath.npdf(w) / mpmath.ncdf(w)

            lo, hi = mpf(-300), mpf(8)
            for _ in range(200):
                mid = (lo + hi) / 2
                if dlogf(mid) > 0:
                    lo = mid
                else:
                    hi = mid
                if hi - lo < mpf(10) ** -10:
                    break
            m = (lo + hi) / 2
            hstep = mpf(10) ** -5
            curv = -(dlogf(m + hstep) - dlogf(m - hstep)) / (2 * hstep)
            w = 1 / mpmath.sqrt(curv)
            pts = {m + k * w for k in (-64, -32, -16, -8, -4, -2, -1, 0, 1, 2, 4, 8, 16, 32, 64)}
            if t != 0 and d / t > 0:  # the step of Phi(t s - d) at s = d / t
                u0, wu = mpmath.log(d / t), 1 / max(abs(d), 1)
                pts |= {u0 + k * wu for k in (-10, -3, -1, 0, 1, 3, 10)}
            pts = [-mpmath.inf] + sorted(pts) + [mpmath.inf]
            peak = logf(m)
            f = lambda u: mpmath.exp(logf(u) - peak) if abs(u) < 10 ** 4 else mpf(0)  # noqa: E731
            val = mpmath.quad(f, pts)
            out.append(val * mpmath.exp(peak))
        return out[0], out[1]


def _mc_two(n, M, U, L, reps, rng):
    xbar = rng.standard_normal(reps) / math.sqrt(n)
    s = np.sqrt(rng.chisquare(n - 1, reps) / (n - 1))
    a = n / 2 - 1
    xu = np.clip(0.5 - (U - xbar) / s * math.sqrt(n) / (2 * (n - 1)), 0, 1)
    xl = np.clip(0.5 - (xbar - L) / s * math.sqrt(n) / (2 * (n - 1)), 0, 1)
    return float(np.mean(sps.betainc(a, a, xu) + sps.betainc(a, a, xl) <= M))


def _mp_pa_centred(n, M, c, dps=30):
    """30-digit Pa_centred for n >= 5 by mpmath.quad over s with a findroot for
    h(s) (generic bisection + secant, independent of pa_two's pieces)."""
    with mp.workdps(dps):
        n_, M, c = mpf(n), mpf(M), mpf(c)
        a, nu, rn = n_ / 2 - 1, n_ - 1, mpmath.sqrt(n_)
        lc = mpmath.log(2) + (nu / 2) * mpmath.log(nu / 2) - mpmath.loggamma(nu / 2)

        def g(d, r):
            yu = min(max(mpf(0.5) - (c - d) * r, mpf(0)), mpf(1))
            yl = min(max(mpf(0.5) - (c + d) * r, mpf(0)), mpf(1))
            return ibeta(a, a, yu) + ibeta(a, a, yl)

        def inner(s):
            r = rn / (2 * nu * s)
            if g(0, r) >= M:
                return mpf(0)
            lo, hi = mpf(0), c + 1 / r
            for _ in range(40):
                mid = (lo + hi) / 2
                lo, hi = (mid, hi) if g(mid, r) <= M else (lo, mid)
            h = mpmath.findroot(lambda d: g(d, r) - M, (lo, hi), solver="anderson")
            return mpmath.exp(lc + (nu - 1) * mpmath.log(s) - nu * s * s / 2) * \
                (2 * mpmath.ncdf(rn * h) - 1)

        s_lo = mpf(math.sqrt(st.chi2.ppf(1e-25, n - 1) / (n - 1)))
        s_hi = mpf(math.sqrt(st.chi2.isf(1e-25, n - 1) / (n - 1)))
        # kinks of h(s): s* and s_e (see pa_two)
        xM = float(sps.betaincinv(float(a), float(a), float(M)))
        xM2 = float(sps.betaincinv(float(a), float(a), float(M) / 2))
        s_e = float(rn) * float(c) / (n - 1) / (1 - 2 * xM2)
        s_st = float(rn) * float(c) / (n - 1) / (1 - xM)
        pts = sorted({s_lo, s_hi} | {mpf(v) for v in (s_st, s_e) if float(s_lo) < v < float(s_hi)})
        return mpmath.quad(inner, pts)


def _nct_crosscheck(pair):
    nu, d = pair
    worst = (0.0, None)
    for t in NCT_T[(nu, d)]:
        c1, s1 = nct_tails(t, nu, d)
        c2, s2 = _chi_mixture_tails(t, nu, d)
        for x1, x2, nm in ((c1, c2, "cdf"), (s1, s2, "sf")):
            rel = float(abs(x1 - x2) / x1)
            if rel > worst[0]:
                worst = (rel, (nu, d, t, nm))
    return worst


def self_test():
    t0 = time.time()
    failures = []

    def check(ok, msg):
        print(("ok   " if ok else "FAIL ") + msg)
        if not ok:
            failures.append(msg)

    # 1. ibeta against mpmath.betainc at 80 digits where the latter converges
    rng = np.random.default_rng(7)
    worst = 0.0
    for _ in range(200):
        a, b = 10 ** rng.uniform(-0.3, 3.5), 10 ** rng.uniform(-0.3, 3.5)
        x = rng.uniform() ** rng.choice([0.1, 1.0, 4.0])
        try:
            with mp.workdps(80):
                ref_v = mpmath.betainc(a, b, 0, x, regularized=True)
        except (ValueError, mpmath.libmp.NoConvergence):
            continue
        worst = max(worst, float(abs(ibeta(a, b, x) - ref_v) / ref_v))
    check(worst < 1e-40, f"ibeta vs mpmath.betainc (80 digits): worst rel {worst:.1e}")

    # 2. nct series against the chi-mixture quadrature, every fixture row
    with _pool() as ex:
        worst, where = max(ex.map(_nct_crosscheck, NCT_PAIRS), key=lambda r: r[0])
    check(worst < 1e-15, f"nct series vs chi-mixture quadrature, 288 rows x 2 tails: "
                         f"worst rel {worst:.1e} at {where}")

    # 3. designs: closed forms, mpmath endpoints, Monte Carlo
    notes = []
    for p1, alpha, p2, beta, D in DESIGN_POINTS[:6] + DESIGN_POINTS[8:9]:
        n, (lo, hi) = design_known_one(p1, alpha, p2, beta, notes)
        z = [z_upper(v) for v in (p1, p2, alpha, beta)]
        n_cf = int(mpmath.ceil(((z[2] + z[3]) / (z[0] - z[1])) ** 2))
        check(n == n_cf, f"known-one {p1, alpha, p2, beta}: n {n} = closed form {n_cf}")
        scan = OneSidedScan(p1, alpha, p2, beta, notes)
        n, (lo, hi), _ = design_unknown_one(p1, alpha, p2, beta, notes, scan)
        rn = mpmath.sqrt(n)
        pa1 = _chi_mixture_tails(hi * rn, n - 1, z_upper(p1) * rn)[1]
        pa2 = _chi_mixture_tails(lo * rn, n - 1, z_upper(p2) * rn)[1]
        check(abs(pa1 - (1 - mpf(alpha))) < 1e-18 and abs(pa2 - mpf(beta)) < 1e-18,
              f"unknown-one {p1, alpha, p2, beta} n {n}: Pa at k_hi, k_lo by chi mixture "
              f"{mpmath.nstr(pa1, 12)}, {mpmath.nstr(pa2, 12)}")
        n, (mlo, mhi) = design_known_two(p1, alpha, p2, beta, D, notes)
        # Pa by direct quadrature of the indicator p_hat(xbar) <= M over xbar
        for M, p, target in ((mlo, p1, 1 - alpha), (mhi, p2, beta)):
            v = math.sqrt(n / (n - 1))
            mu = mu_of_p_double(p, D)
            ph = lambda x: sps.ndtr(-v * (D - x)) + sps.ndtr(-v * (x + D))  # noqa: E731
            hh = opt.brentq(lambda x: ph(x) - float(M), 0, D + 40)
            pa = si.quad(lambda x: st.norm.pdf(x, mu, 1 / math.sqrt(n)), -hh, hh,
                         epsabs=1e-14)[0]
            check(abs(pa - target) < 1e-9, f"known-two {p1, alpha, p2, beta} D {D} n {n}: "
                                           f"Pa {pa:.12f} vs {target}")
    # 4. unknown-two: centred Pa by an independent 30-digit evaluation and by MC
    rngmc = np.random.default_rng(12345)
    for n, M, p in ((18, 0.0878, 0.04), (43, 0.0265, 0.06), (9, 0.05, 0.03), (120, 0.0105, 0.005)):
        c = zf(p / 2)
        fast = pa_two(n, M, c)
        slow = float(_mp_pa_centred(n, M, c))
        check(abs(fast - slow) < 1e-13, f"pa_two centred n {n} M {M} p {p}: {fast!r} vs "
                                        f"30-digit {slow!r}")
    for n, M, p, w in ((18, 0.0878, 0.04, 0.5), (43, 0.0265, 0.01, 0.75), (5, 0.06, 0.03, 0.9),
                       (3, 0.1, 0.05, 0.5), (3, 0.3, 0.2, 0.5), (4, 0.1, 0.1, 0.6)):
        zu, zl = zf(w * p), zf((1 - w) * p)
        pa = pa_two(n, M, (zu + zl) / 2, (zu - zl) / 2)
        reps = 4_000_000
        mc = _mc_two(n, M, zu, -zl, reps, rngmc)
        se = math.sqrt(mc * (1 - mc) / reps)
        check(abs(pa - mc) < 4.5 * se, f"pa_two n {n} M {M} p {p} w {w}: {pa:.6f} vs MC "
                                       f"{mc:.6f} +- {se:.1e}")
    for n, M, p in ((18, 0.0878, 0.04), (6, 0.08, 0.1)):
        one = float(pa_two_one(n, M, p))
        near = pa_split(n, M, p, 1 - 1e-9)
        check(abs(one - near) < 1e-7, f"pa_two at w -> 1 {near:.10f} vs one-sided {one:.10f}")
    # 5. MVU estimators are unbiased: Monte Carlo mean of p_hat vs p
    for n, known in ((3, False), (4, False), (10, False), (25, True), (6, True)):
        mu, U, L = 0.3, 2.0, -1.5
        reps = 2_000_000
        x = rngmc.standard_normal((reps, 1)) / math.sqrt(n) + mu
        s = np.sqrt(rngmc.chisquare(n - 1, (reps, 1)) / (n - 1))
        if known:
            v = math.sqrt(n / (n - 1))
            est = sps.ndtr(-v * (U - x)) + sps.ndtr(-v * (x - L))
        else:
            a = n / 2 - 1
            est = sps.betainc(a, a, np.clip(0.5 - (U - x) / s * math.sqrt(n) / (2 * (n - 1)), 0, 1)) \
                + sps.betainc(a, a, np.clip(0.5 - (x - L) / s * math.sqrt(n) / (2 * (n - 1)), 0, 1))
        p = st.norm.sf(U - mu) + st.norm.cdf(L - mu)
        m, se = float(est.mean()), float(est.std() / math.sqrt(reps))
        check(abs(m - p) < 4.5 * se, f"MVU {'known' if known else 'unknown'} sigma n {n}: "
                                     f"mean p_hat {m:.6f} vs p {p:.6f} (+- {se:.1e})")
    # 6. Anderson-Darling p-value formula against Monte Carlo at the fixture's A*^2
    rows = build_anderson([])
    for row in rows:
        n, a2 = row["n"], row["a2"]
        reps = 200_000
        z = np.sort(rngmc.standard_normal((reps, n)), axis=1)
        z = (z - z.mean(axis=1, keepdims=True)) / z.std(axis=1, ddof=1, keepdims=True)
        i = np.arange(1, n + 1)
        A = -n - np.sum((2 * i - 1) / n * (sps.log_ndtr(z) + sps.log_ndtr(-z[:, ::-1])), axis=1)
        mc = float(np.mean(A >= a2))
        se = math.sqrt(max(mc * (1 - mc), 1 / reps) / reps)
        pv = row["p_value"]
        ok = abs(mc - pv) < max(4.5 * se, 0.1 * pv, 0.005)
        check(ok, f"AD {row['source']} n {n}: A*^2 {row['a2_star']:.4f} formula p "
                  f"{pv:.3g} vs MC {mc:.3g} +- {se:.1e}")
    print(f"self-test: {len(failures)} failure(s) in {time.time() - t0:.0f} s")
    if failures:
        sys.exit(1)


# --------------------------------------------------------------------------
# Benchmark
# --------------------------------------------------------------------------


def bench():
    """Time each fixture section and the main kernels."""
    notes, timings = [], {}
    t = time.perf_counter()
    build_fixture(notes, timings)
    total = time.perf_counter() - t
    for name, secs in timings.items():
        print(f"bench section {name}: {secs:.2f} s")
    print(f"bench whole fixture: {total:.2f} s")

    def med(fn, reps):
        ts = []
        for _ in range(reps):
            t = time.perf_counter()
            fn()
            ts.append(time.perf_counter() - t)
        return statistics.median(ts)

    print(f"bench nct_tails(5.4571, 9999, 0.7): {med(lambda: nct_tails(5.4571, 9999, 0.7), 5):.3f} s")
    print(f"bench nct_tails(0.4057, 1, 40): {med(lambda: nct_tails(0.4057, 1, 40.0), 5):.3f} s")
    print(f"bench pa_two n=410 (double): "
          f"{med(lambda: pa_two(410, 0.01465, zf(0.01)), 50) * 1e3:.2f} ms")


# --------------------------------------------------------------------------
# Main
# --------------------------------------------------------------------------


def main(argv=None):
    args = ref.parse_args(argv, __doc__)

    if args.bench:
        bench()
        return 0
    if args.self_test:
        self_test()
        return 0

    t0 = time.time()
    notes, timings = [], {}
    text = render(build_fixture(notes, timings))
    if args.verbose:
        for line in notes:
            print("note:", line)
        for name, secs in timings.items():
            print(f"note: section {name} built in {secs:.1f} s")
        print(f"built in {time.time() - t0:.1f} s with scipy {scipy.__version__}, "
              f"numpy {np.__version__}, mpmath {mpmath.__version__}")
    return ref.write_or_check(FIXTURE, text, "make_variables_reference.py", args.check)


if __name__ == "__main__":
    sys.exit(main())
