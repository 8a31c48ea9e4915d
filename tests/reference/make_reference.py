#!/usr/bin/env python3
"""Independent reference values for lotsman's test-suite.

Writes ``tests/data/reference.json`` from first principles, using only
general-purpose numerical libraries (scipy.stats for fast double-precision
distribution functions, mpmath for 50-digit checks).  Nothing here is
derived from any acceptance-sampling package.

Usage (from the repository root)::

    python3 tests/reference/make_reference.py             # (re)write the fixture
    python3 tests/reference/make_reference.py --check     # exit 1 if it would change
    python3 tests/reference/make_reference.py --bench     # print timings, write nothing
    python3 tests/reference/make_reference.py --self-test # brute-force cross-checks

Conventions (mirrored exactly by the Rust code):

* quality ``p`` is a fraction in (0, 1); for Poisson it is nonconformities
  per unit (> 0) and ``lambda = n * p``;
* acceptance probability ``Pa(n, c, p) = P(X <= c)`` with X binomial(n, p),
  Poisson(n p) or hypergeometric (lot N, D nonconforming, sample n), where
  ``D = clamp(floor(p * N + 0.5), 0, N)`` with ``p * N`` evaluated in binary64;
* producer's risk ``P(X >= c + 1)`` at p1 (an upper tail computed directly),
  consumer's risk ``P(X <= c)`` at p2.

The output is deterministic: keys are sorted, floats are written with
Python's ``repr`` (shortest round-trip form, the ``json`` default) and no
timestamps or versions are embedded in the data.
"""

from __future__ import annotations

import argparse
import itertools
import json
import math
import statistics
import sys
import time
from fractions import Fraction
from pathlib import Path

import mpmath
import numpy as np
import scipy
import scipy.stats as st
from mpmath import mp, mpf

REPO = Path(__file__).resolve().parents[2]
FIXTURE = REPO / "tests" / "data" / "reference.json"

#: Working precision (decimal digits) of every mpmath evaluation.
MP_DPS = 50
mp.dps = MP_DPS

BIN, POI, HYP = "binomial", "poisson", "hypergeometric"
MODELS = (BIN, POI, HYP)

#: Largest acceptance number scanned before a design is declared "no plan".
C_CAP = 2000


# --------------------------------------------------------------------------
# Shared helpers
# --------------------------------------------------------------------------


def lot_defectives(p: float, lot_size: int) -> int:
    """Number of nonconforming units D in a lot of ``lot_size`` at quality p.

    Round half up of ``x = p * N``, with a relative allowance of 1e-9 for
    binary rounding so that the decimal the user wrote decides: 0.29 * 50
    is 14.499999999999998 in binary64 but means 14.5, which rounds up to
    15; 0.07 * 100 = 7.000000000000001 means 7. Then clamped to [0, N].
    """
    x = p * lot_size
    d = math.floor(x + 0.5 + 1e-9 * max(1.0, x))
    return min(max(d, 0), lot_size)


def to_float(x) -> float:
    """Round an mpmath number (or int/Fraction) to the nearest binary64."""
    if isinstance(x, Fraction):
        return float(x)  # correctly rounded
    v = float(mpf(x))  # mpf -> float rounds to nearest (context rounding 'n')
    return v + 0.0  # normalise -0.0


def _quality_param(model: str, p: float, lot_size: int | None):
    """The distribution parameter used by the models: p itself, or D."""
    return lot_defectives(p, lot_size) if model == HYP else p


# --------------------------------------------------------------------------
# 50-digit tail probabilities (mpmath)
# --------------------------------------------------------------------------
#
# Method: direct summation of probability-mass terms at 50 significant
# digits.  The term at the starting index is anchored through log-gamma
# (exact to ~1e-40 relative even for arguments near 1e8); the neighbouring
# terms follow from the exact ratio pmf(k+-1)/pmf(k).  Each tail is summed
# on its own (never as 1 - the other tail), walking away from c and
# stopping once past the mode when a term falls below 1e-60 of the running
# sum (terms then decrease geometrically, so the truncation error is far
# below the 50-digit working precision).
#
# mpmath's own betainc is not used for the binomial because, in mpmath
# 1.3.0, it raises NoConvergence / ValueError or takes ~15 s per value for
# parameters like n = 1e7, c = 1e4 (it evaluates a terminating 2F1 with
# massive cancellation).  The Poisson tails use mpmath's regularised
# incomplete gamma function, which is fast and exact here; the summation
# agrees with it to ~1e-45 (checked in --self-test and on every fixture row).


def _sum_terms(term, k, k_end, ratio, direction, mode):
    """Sum a unimodal pmf from index k (value ``term``) towards ``k_end``.

    ``ratio(k)`` returns pmf(k + direction) / pmf(k).  ``k_end`` may be
    None for an unbounded support.  Summation stops at ``k_end`` or, once
    the walk is past the mode, when a term drops below 1e-60 * sum.
    """
    total = term
    eps = mpf(10) ** (-(MP_DPS + 10))
    while k != k_end:
        term = term * ratio(k)
        k += direction
        total += term
        past_mode = k > mode if direction > 0 else k < mode
        if past_mode and term <= eps * total:
            break
    return total


def _log_comb(a: int, b: int):
    """log C(a, b) via log-gamma at working precision."""
    return mp.loggamma(a + 1) - mp.loggamma(b + 1) - mp.loggamma(a - b + 1)


def mp_binom_tails(n: int, c: int, p):
    """(P(X <= c), P(X > c)) for X ~ Binomial(n, p), 50 digits, by summation."""
    if c < 0:
        return mpf(0), mpf(1)
    if c >= n:
        return mpf(1), mpf(0)
    with mp.workdps(MP_DPS + 10):
        p = mpf(p)
        q = 1 - p
        lp, lq = mp.log(p), mp.log1p(-p)
        mode = int(mp.floor((n + 1) * p))

        def pmf(k):
            return mp.exp(_log_comb(n, k) + k * lp + (n - k) * lq)

        def up(k):  # pmf(k+1)/pmf(k)
            return (n - k) * p / ((k + 1) * q)

        def down(k):  # pmf(k-1)/pmf(k)
            return k * q / ((n - k + 1) * p)

        cdf = _sum_terms(pmf(c), c, 0, down, -1, mode)
        sf = _sum_terms(pmf(c + 1), c + 1, n, up, +1, mode)
    return +cdf, +sf


def mp_poisson_tails(lam, c: int):
    """(P(X <= c), P(X > c)) for X ~ Poisson(lam) via regularised gammainc."""
    if c < 0:
        return mpf(0), mpf(1)
    lam = mpf(lam)
    cdf = mp.gammainc(c + 1, lam, mp.inf, regularized=True)  # Q(c+1, lam)
    sf = mp.gammainc(c + 1, 0, lam, regularized=True)  # P(c+1, lam)
    return cdf, sf


def mp_poisson_tails_sum(lam, c: int):
    """Poisson tails by direct summation (independent check of gammainc)."""
    if c < 0:
        return mpf(0), mpf(1)
    with mp.workdps(MP_DPS + 10):
        lam = mpf(lam)
        mode = int(mp.floor(lam))

        def pmf(k):
            return mp.exp(-lam + k * mp.log(lam) - mp.loggamma(k + 1))

        cdf = _sum_terms(pmf(c), c, 0, lambda k: k / lam, -1, mode)
        sf = _sum_terms(pmf(c + 1), c + 1, None, lambda k: lam / (k + 1), +1, mode)
    return +cdf, +sf


def mp_hyper_tails(lot: int, bad: int, n: int, c: int):
    """(P(X <= c), P(X > c)) for X ~ Hypergeometric(lot, bad, sample n).

    Exact summation of C(D,k) C(N-D,n-k) / C(N,n) at 50 digits.
    """
    lo, hi = max(0, n - (lot - bad)), min(n, bad)
    if c < lo:
        return mpf(0), mpf(1)
    if c >= hi:
        return mpf(1), mpf(0)
    good = lot - bad
    with mp.workdps(MP_DPS + 10):
        log_total = _log_comb(lot, n)
        mode = int(mp.floor(mpf((n + 1) * (bad + 1)) / (lot + 2)))

        def pmf(k):
            return mp.exp(_log_comb(bad, k) + _log_comb(good, n - k) - log_total)

        def up(k):  # pmf(k+1)/pmf(k)
            return mpf((bad - k) * (n - k)) / ((k + 1) * (good - n + k + 1))

        def down(k):  # pmf(k-1)/pmf(k)
            return mpf(k * (good - n + k)) / ((bad - k + 1) * (n - k + 1))

        cdf = _sum_terms(pmf(c), c, lo, down, -1, mode)
        sf = _sum_terms(pmf(c + 1), c + 1, hi, up, +1, mode)
    return +cdf, +sf


def mp_tails(model: str, n: int, c: int, p: float, lot_size: int | None = None):
    """50-digit (cdf, sf) of the acceptance-number statistic at quality p."""
    if model == BIN:
        return mp_binom_tails(n, c, p)
    if model == POI:
        return mp_poisson_tails(mpf(n) * mpf(p), c)  # lambda = n*p exactly
    return mp_hyper_tails(lot_size, lot_defectives(p, lot_size), n, c)


# --------------------------------------------------------------------------
# Double-precision tails (scipy.stats) used by the design search
# --------------------------------------------------------------------------


def sp_cdf(model: str, n: int, c: int, q, lot_size: int | None) -> float:
    """P(X <= c) with scipy.stats; q is p (binomial, Poisson) or D (hypergeom.)."""
    if model == BIN:
        return float(st.binom.cdf(c, n, q))
    if model == POI:
        return float(st.poisson.cdf(c, n * q))
    return float(st.hypergeom.cdf(c, lot_size, q, n))


def sp_sf(model: str, n: int, c: int, q, lot_size: int | None) -> float:
    """P(X > c) with scipy.stats (computed as an upper tail, not 1 - cdf)."""
    if model == BIN:
        return float(st.binom.sf(c, n, q))
    if model == POI:
        return float(st.poisson.sf(c, n * q))
    return float(st.hypergeom.sf(c, lot_size, q, n))


# --------------------------------------------------------------------------
# Exact single-sampling design (exhaustive over c, bisection over n)
# --------------------------------------------------------------------------


class DesignProblem:
    """A two-point (p1, alpha; p2, beta) single-sampling design problem."""

    def __init__(self, model, p1, alpha, p2, beta, lot_size=None):
        self.model, self.p1, self.alpha = model, p1, alpha
        self.p2, self.beta, self.lot_size = p2, beta, lot_size
        self.q1 = _quality_param(model, p1, lot_size)
        self.q2 = _quality_param(model, p2, lot_size)
        self.n_cap = lot_size if model == HYP else None

    def pa1(self, n, c):
        """Pa(n, c, p1) in double precision."""
        return sp_cdf(self.model, n, c, self.q1, self.lot_size)

    def pa2(self, n, c):
        """Pa(n, c, p2) in double precision."""
        return sp_cdf(self.model, n, c, self.q2, self.lot_size)

    def producer_risk(self, n, c):
        """P(X >= c+1) at p1 in double precision."""
        return sp_sf(self.model, n, c, self.q1, self.lot_size)

    def smallest_n(self, c):
        """Smallest sample that can hold a count above c: c + 1 units for
        the unit-count models, 1 unit for Poisson (a unit may carry several
        nonconformities, so c >= n is a meaningful plan)."""
        return 1 if self.model == POI else c + 1

    def consumer_ok(self, n, c):
        return self.pa2(n, c) <= self.beta

    def producer_ok(self, n, c):
        return self.pa1(n, c) >= 1 - self.alpha

    def n_min(self, c, lower=None):
        """Smallest n >= smallest_n(c) with Pa(n, c, p2) <= beta, or None (n > N).

        Pa is nonincreasing in n, so an exponential (galloping) search
        followed by bisection on the exact CDF finds the boundary.  ``lower``
        is a known n < answer (e.g. n_min(c-1) - 1, valid because Pa grows
        with c); Pa(c, c, p) = 1 > beta makes n = c a valid starting point.
        """
        floor = self.smallest_n(c) - 1  # Pa = 1 > beta below the first usable n
        lo = floor if lower is None else max(floor, lower)  # invariant: Pa(lo) > beta
        step, hi = 1, lo + 1
        while True:
            if self.n_cap is not None and hi >= self.n_cap:
                hi = self.n_cap
                if not self.consumer_ok(hi, c):
                    return None
                break
            if self.consumer_ok(hi, c):
                break
            lo, step = hi, step * 2
            hi = lo + step
        while hi - lo > 1:  # bisection: Pa(lo) > beta >= Pa(hi)
            mid = (lo + hi) // 2
            if self.consumer_ok(mid, c):
                hi = mid
            else:
                lo = mid
        return hi

    def n_max(self, c):
        """Largest n >= 1 with Pa(n, c, p1) >= 1 - alpha (<= N), or None.

        Binomial / hypergeometric: Pa(n, c) = 1 for n <= c, so the search
        starts at max(1, c).  Poisson: Pa(n, c) < 1 for every n, so it starts
        at n = 1 and None is possible for any c (large p per unit).
        """
        lo = 1 if self.model == POI else max(1, c)
        if self.n_cap is not None:
            lo = min(lo, self.n_cap)
        if not self.producer_ok(lo, c):
            return None
        if lo == self.n_cap:
            return lo
        step, hi = 1, lo + 1
        while True:
            if self.n_cap is not None and hi >= self.n_cap:
                hi = self.n_cap
                if self.producer_ok(hi, c):
                    return hi
                break
            if not self.producer_ok(hi, c):
                break
            lo, step = hi, step * 2
            hi = lo + step
        while hi - lo > 1:  # bisection: Pa(lo) >= 1-alpha > Pa(hi)
            mid = (lo + hi) // 2
            if self.producer_ok(mid, c):
                lo = mid
            else:
                hi = mid
        return lo

    def solve(self):
        """Exhaustive exact design.

        For c = 0, 1, ...: n_min(c) is the smallest n meeting the consumer's
        point; c is feasible iff Pa(n_min(c), c, p1) >= 1 - alpha.  n_min is
        nondecreasing in c, so the scan stops once n_min(c) exceeds the best
        n found (or at C_CAP / when n_min(c) does not exist for a lot).
        Tie rule at the best n: among all c meeting both points there,
        minimise max(producer_risk/alpha, consumer_risk/beta), then c.

        Returns dict(n, c, producer_risk, consumer_risk, n_mins, ties) with
        n = None when no plan exists.
        """
        best_n, n_mins, prev = None, [], None
        for c in range(C_CAP + 1):
            nm = self.n_min(c, None if prev is None else prev - 1)
            if nm is None:
                break  # n_min(c') is undefined for all c' >= c too
            if best_n is not None and nm > best_n:
                break
            n_mins.append(nm)
            prev = nm
            if self.producer_ok(nm, c) and (best_n is None or nm < best_n):
                best_n = nm
        if best_n is None:
            return dict(n=None, c=None, producer_risk=None, consumer_risk=None,
                        n_mins=n_mins, ties=[])
        scored = []
        for c, nm in enumerate(n_mins):
            if nm <= best_n and (self.model == POI or c < best_n) and self.producer_ok(best_n, c) \
                    and self.consumer_ok(best_n, c):
                pr, cr = self.producer_risk(best_n, c), self.pa2(best_n, c)
                scored.append((max(pr / self.alpha, cr / self.beta), c, pr, cr))
        scored.sort()
        _, c, pr, cr = scored[0]
        return dict(n=best_n, c=c, producer_risk=pr, consumer_risk=cr,
                    n_mins=n_mins, ties=scored)


class TailDesignProblem(DesignProblem):
    """A design problem whose every test is on its own tail at 50 digits.

    DesignProblem tests the producer's point as Pa >= 1 - alpha in double
    precision, where 1 - alpha rounds to 1 for a risk below about 1e-16.
    Here the producer's point is P(X > c) <= alpha and the consumer's
    P(X <= c) <= beta, both with mpmath, so risks of 5e-17 and 1e-30 are
    met as such (issue 14, item 4). The search itself (n_min by galloping
    and bisection, the scan over c, the tie rule) is DesignProblem's.
    """

    def _tails(self, n, c, p):
        return mp_tails(self.model, n, c, p, self.lot_size)

    def pa1(self, n, c):
        return self._tails(n, c, self.p1)[0]

    def pa2(self, n, c):
        return self._tails(n, c, self.p2)[0]

    def producer_risk(self, n, c):
        return self._tails(n, c, self.p1)[1]

    def producer_ok(self, n, c):
        return self.producer_risk(n, c) <= mpf(self.alpha)

    def consumer_ok(self, n, c):
        return self.pa2(n, c) <= mpf(self.beta)


def extreme_design_row(model, p1, alpha, p2, beta, lot):
    """The smallest single plan for risks far below 1e-16, by
    TailDesignProblem, with its achieved risks at 50 digits, and a check
    that one unit less meets no acceptance number."""
    prob = TailDesignProblem(model, p1, alpha, p2, beta, lot)
    res = prob.solve()
    n, c = res["n"], res["c"]
    cs = range(4 * n + 50) if model == POI else range(n - 1)
    assert not any(prob.producer_ok(n - 1, k) and prob.consumer_ok(n - 1, k) for k in cs)
    return dict(model=model, p1=p1, alpha=alpha, p2=p2, beta=beta, lot_size=lot, n=n, c=c,
                producer_risk=to_float(res["producer_risk"]),
                consumer_risk=to_float(res["consumer_risk"]))


def naive_design(prob: DesignProblem, n_limit: int):
    """Reference-of-the-reference: scan every n = 1.. and every c = 0..n-1.

    Vectorised over c with scipy.stats; returns (n, c) or (None, None).
    """
    m, L = prob.model, prob.lot_size
    top = n_limit if L is None else min(n_limit, L)
    for n in range(1, top + 1):
        cs = np.arange(4 * n + 50 if m == POI else n)
        if m == BIN:
            a1, s1, a2 = st.binom.cdf(cs, n, prob.q1), st.binom.sf(cs, n, prob.q1), \
                st.binom.cdf(cs, n, prob.q2)
        elif m == POI:
            a1, s1, a2 = st.poisson.cdf(cs, n * prob.q1), st.poisson.sf(cs, n * prob.q1), \
                st.poisson.cdf(cs, n * prob.q2)
        else:
            a1, s1, a2 = st.hypergeom.cdf(cs, L, prob.q1, n), \
                st.hypergeom.sf(cs, L, prob.q1, n), st.hypergeom.cdf(cs, L, prob.q2, n)
        ok = (a1 >= 1 - prob.alpha) & (a2 <= prob.beta)
        if ok.any():
            best = min((max(s1[c] / prob.alpha, a2[c] / prob.beta), c)
                       for c in np.nonzero(ok)[0])
            return n, int(best[1])
    return None, None


#: Relative distance from a threshold below which a boundary is flagged.
NEAR_TIE = 1e-12


def mp_verify_alternative(prob: DesignProblem, c, n_min, n_max, margins):
    """Re-check the n_min / n_max boundaries of one c at 50 digits.

    Appends the relative distance of each boundary Pa from its threshold
    to ``margins`` and raises if scipy's decision disagrees with mpmath's.
    Returns the names ("n_min", "n_max") whose boundary Pa lies within
    NEAR_TIE of its threshold, i.e. decisions that hinge on the last bits
    (typically exact decimal ties such as Pa = 95/100 against 1 - 0.05).
    """
    start = len(margins)
    m, L = prob.model, prob.lot_size
    beta, target = mpf(prob.beta), 1 - mpf(prob.alpha)

    def pa(n, p):
        return mp_tails(m, n, c, p, L)[0]

    if n_min is not None:
        v = pa(n_min, prob.p2)
        assert v <= beta, (prob.__dict__, c, "n_min")
        margins.append((abs(v - beta) / beta, prob.model, prob.p1, prob.p2, c, "n_min"))
        if n_min - 1 >= prob.smallest_n(c):
            v = pa(n_min - 1, prob.p2)
            assert v > beta, (prob.__dict__, c, "n_min-1")
            margins.append((abs(v - beta) / beta, prob.model, prob.p1, prob.p2, c, "n_min-1"))
    elif m == HYP:
        assert pa(L, prob.p2) > beta
    if n_max is not None:
        v = pa(n_max, prob.p1)
        assert v >= target, (prob.__dict__, c, "n_max")
        margins.append((abs(v - target) / target, prob.model, prob.p1, prob.p2, c, "n_max"))
        if L is None or n_max < L:
            v = pa(n_max + 1, prob.p1)
            assert v < target, (prob.__dict__, c, "n_max+1")
            margins.append((abs(v - target) / target, prob.model, prob.p1, prob.p2, c,
                            "n_max+1"))
    else:
        assert (c == 0 or m == POI) and pa(1, prob.p1) < target
    base = {"n_min": "n_min", "n_min-1": "n_min", "n_max": "n_max", "n_max+1": "n_max"}
    return sorted({base[x[-1]] for x in margins[start:] if x[0] < NEAR_TIE})


# --------------------------------------------------------------------------
# Plan measures (mpmath)
# --------------------------------------------------------------------------


def mp_asn_curtailed(model, n, c, p, lot_size=None):
    """Expected units inspected under fully curtailed inspection.

    Inspection stops at the (c+1)-th nonconforming unit (reject) or at the
    (n-c)-th conforming unit (accept); for Poisson only at rejection.  Closed forms (negative-binomial /
    negative-hypergeometric stopping times, verified by enumeration in
    --self-test):

    binomial:  (c+1)/p P(Bin(n+1,p) >= c+2) + (n-c)/(1-p) P(Bin(n+1,p) <= c)
    hypergeom: (c+1)(N+1)/(D+1) P(HG(N+1, D+1, n+1) >= c+2)
               + (n-c)(N+1)/(N-D+1) P(HG(N+1, D, n+1) <= c)
    """
    if model == BIN:
        p = mpf(p)
        return (c + 1) / p * mp_binom_tails(n + 1, c + 1, p)[1] \
            + (n - c) / (1 - p) * mp_binom_tails(n + 1, c, p)[0]
    if model == HYP:
        N, D = lot_size, lot_defectives(p, lot_size)
        return mpf((c + 1) * (N + 1)) / (D + 1) * mp_hyper_tails(N + 1, D + 1, n + 1, c + 1)[1] \
            + mpf((n - c) * (N + 1)) / (N - D + 1) * mp_hyper_tails(N + 1, D, n + 1, c)[0]
    # Poisson: a unit may hold any number of nonconformities, so only the
    # rejection can be certain early; the t-th unit is inspected when the
    # first t units hold at most c: sum_{t<n} P(Poisson(t p) <= c).
    # Long stages by mpmath's Euler-Maclaurin summation (numerical
    # derivatives at the ends), short ones term by term.
    p = mpf(p)
    if n > 5000:
        return mp.sumem(lambda t: mp.gammainc(c + 1, t * p, mp.inf, regularized=True), [0, n - 1])
    return mp.fsum(mp_poisson_tails(t * p, c)[0] if t else mpf(1) for t in range(n))


def measures_row(model, n, c, lot_size, p):
    """pa, AOQ, ATI, ASN and curtailed ASN of plan (n, c) at quality p.

    A finite lot (hypergeometric) holds D = round(p N) nonconforming units,
    so its quality is D/N: every measure, the AOQ's quality factor
    included, is taken there, and the row gives D and D/N beside p (issue
    14, item 2: a quality as typed in the AOQ made two qualities of one lot
    differ, and an AOQ exceed the AOQL).
    """
    cdf, sf = mp_tails(model, n, c, p, lot_size)
    lot_d = lot_defectives(p, lot_size) if model == HYP else None
    P = mpf(p) if lot_d is None else mpf(lot_d) / lot_size
    if lot_size is None:
        aoq, ati = cdf * P, None
    else:
        aoq = cdf * P * (lot_size - n) / lot_size
        ati = n + sf * (lot_size - n)  # n + (1 - pa)(N - n), 1 - pa taken as sf
    asn_c = mp_asn_curtailed(model, n, c, p, lot_size)
    return dict(model=model, n=n, c=c, lot_size=lot_size, p=p,
                lot_nonconforming=lot_d,
                lot_quality=None if lot_d is None else to_float(P),
                pa=to_float(cdf), aoq=to_float(aoq),
                ati=None if ati is None else to_float(ati), asn=n,
                asn_curtailed=None if asn_c is None else to_float(asn_c))


# --------------------------------------------------------------------------
# AOQL and indifference quality (mpmath)
# --------------------------------------------------------------------------


def _grid_argmax(f, grid):
    """Index of the largest f(x) over the grid (first one on ties)."""
    vals = [f(x) for x in grid]
    return max(range(len(vals)), key=vals.__getitem__)


def mp_aoql(model, n, c, lot_size=None):
    """AOQL = max_p AOQ(p) and the quality at which it occurs.

    Binomial / Poisson: AOQ(p) = Pa(p) p f with f = (N-n)/N or 1; the
    maximiser solves d/dp [p Pa(p)] = Pa(p) - p n pmf = 0, where
    dPa/dp = -n C(n-1,c) p^c (1-p)^(n-1-c) (binomial) or -n pois(c; n p)
    (Poisson).  The root is bracketed from a coarse double-precision scan
    (scipy) and refined with mpmath.findroot (Anderson-Bjorck, bracketed).
    Hypergeometric: max over integer D = 0..N of Pa(D) (D/N) (N-n)/N,
    scanned in double precision, the neighbourhood re-evaluated at 50 digits.
    """
    factor = mpf(1) if lot_size is None else mpf(lot_size - n) / lot_size
    if model in (BIN, POI):
        if model == BIN:
            def g(p):
                pmf = mp.exp(_log_comb(n - 1, c) + c * mp.log(p) + (n - 1 - c) * mp.log1p(-p))
                return mp_binom_tails(n, c, p)[0] - p * n * pmf

            def fl(p):
                return float(st.binom.cdf(c, n, p)) * p
        else:
            def g(p):
                lam = n * p
                return mp_poisson_tails(lam, c)[0] - lam * mp.exp(
                    -lam + c * mp.log(lam) - mp.loggamma(c + 1))

            def fl(p):
                return float(st.poisson.cdf(c, n * p)) * p
        hi_p = min(1.0, 4.0 * (c + 3) / n)  # the maximiser lies near (c+1)/n
        grid = [hi_p * k / 4000 for k in range(1, 4000)]
        i = _grid_argmax(fl, grid)
        a, b = grid[max(i - 1, 0)], grid[min(i + 1, len(grid) - 1)]
        assert g(mpf(a)) > 0 > g(mpf(b))
        with mp.workdps(40):
            p_star = mp.findroot(g, (mpf(a), mpf(b)), solver="anderson")
        pa = mp_tails(model, n, c, p_star)[0] if model == BIN else \
            mp_poisson_tails(n * p_star, c)[0]
        return to_float(pa * p_star * factor), to_float(p_star)
    N = lot_size
    Ds = np.arange(N + 1)
    vals = st.hypergeom.cdf(c, N, Ds, n) * Ds / N
    d0 = int(np.argmax(vals))
    best = None
    for D in range(max(0, d0 - 25), min(N, d0 + 25) + 1):
        v = mp_hyper_tails(N, D, n, c)[0] * mpf(D) / N * factor
        if best is None or v > best[0]:
            best = (v, D)
    return to_float(best[0]), to_float(Fraction(best[1], N))


def mp_indifference(model, n, c, lot_size=None):
    """Quality with Pa = 0.5 (binomial/Poisson root; hypergeom. smallest D/N).

    The continuous roots are bracketed by bisection in double precision
    (scipy) and refined with mpmath.findroot; the hypergeometric case is a
    bisection over integer D on the 50-digit CDF (Pa is nonincreasing in D).
    """
    half = mpf(1) / 2
    if model in (BIN, POI):
        if model == BIN:
            def h(p):
                return mp_binom_tails(n, c, p)[0] - half

            a, b = 0.0, 1.0
            fl = lambda p: st.binom.cdf(c, n, p) - 0.5  # noqa: E731
        else:
            def h(p):
                return mp_poisson_tails(n * p, c)[0] - half

            a, b = 0.0, (c + 1) * 4.0 / n
            fl = lambda p: st.poisson.cdf(c, n * p) - 0.5  # noqa: E731
        for _ in range(40):
            m = (a + b) / 2
            a, b = (m, b) if fl(m) > 0 else (a, m)
        with mp.workdps(40):
            root = mp.findroot(h, (mpf(a), mpf(b)), solver="anderson")
        return to_float(root)
    N = lot_size
    lo, hi = -1, N  # Pa(D = N) = 0 <= 0.5 since c < n; Pa(D = -1) treated as 1
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if mp_hyper_tails(N, mid, n, c)[0] <= half:
            hi = mid
        else:
            lo = mid
    return to_float(Fraction(hi, N))


def poisson_unity_row(c, alpha, beta):
    """lambda1: P(Pois <= c) = 1 - alpha; lambda2: = beta; ratio lambda2/lambda1.

    Roots found with mpmath.findroot at 30 digits, started from the
    chi-square identity P(Pois(l) <= c) = P(chi2_{2c+2} > 2 l) via scipy.
    """
    with mp.workdps(30):
        a, b = mpf(str(alpha)), mpf(str(beta))

        def root(target, guess):
            return mp.findroot(
                lambda lam: mp.gammainc(c + 1, lam, mp.inf, regularized=True) - target,
                mpf(guess))

        l1 = root(1 - a, st.chi2.ppf(alpha, 2 * c + 2) / 2)
        l2 = root(b, st.chi2.ppf(1 - beta, 2 * c + 2) / 2)
        return dict(c=c, alpha=alpha, beta=beta, lambda1=to_float(l1),
                    lambda2=to_float(l2), ratio=to_float(l2 / l1))


# --------------------------------------------------------------------------
# Fixture cases
# --------------------------------------------------------------------------


def _hg(n, c, D, N):
    """Hypergeometric tail case given D directly (p = D/N rounds back to D)."""
    p = D / N
    assert lot_defectives(p, N) == D
    return (HYP, n, c, p, N)


TAIL_CASES = [
    # binomial: body, c = 0, c near the mean, extreme n, tiny p, deep tails
    (BIN, 1, 0, 0.3, None),
    (BIN, 5, 5, 0.5, None),
    (BIN, 20, 3, 0.1, None),
    (BIN, 50, 0, 0.02, None),
    (BIN, 100, 2, 0.05, None),
    (BIN, 200, 4, 0.02, None),
    (BIN, 80, 40, 0.5, None),
    (BIN, 500, 25, 0.05, None),
    (BIN, 1000, 10, 0.01, None),
    (BIN, 1000, 0, 0.001, None),
    (BIN, 1000, 900, 0.5, None),
    (BIN, 1000, 50, 0.5, None),
    (BIN, 2000, 390, 0.6, None),  # cdf ~ 6e-301
    (BIN, 5000, 2500, 0.3, None),
    (BIN, 1000000, 100, 0.0001, None),
    (BIN, 1000000, 0, 1e-7, None),
    (BIN, 1000000, 8, 1e-7, None),
    (BIN, 2000000, 220, 0.0001, None),
    (BIN, 2000000, 220, 0.000125, None),
    (BIN, 10000000, 0, 1e-7, None),
    (BIN, 10000000, 5, 1e-7, None),
    (BIN, 10000000, 30, 1e-6, None),
    (BIN, 10000000, 2000, 0.0001, None),
    (BIN, 10000000, 9000, 0.001, None),
    (BIN, 10000000, 10000, 0.001, None),
    (BIN, 10000000, 11500, 0.001, None),
    (BIN, 10000000, 10000, 0.001417, None),  # cdf ~ 1e-300
    (BIN, 10000000, 10000, 0.000674, None),  # sf ~ 1e-300
    # Poisson (p per unit, lambda = n p)
    (POI, 1, 0, 0.5, None),
    (POI, 100, 2, 0.01, None),
    (POI, 50, 5, 0.04, None),
    (POI, 200, 4, 0.02, None),
    (POI, 1000, 0, 0.003, None),
    (POI, 10, 0, 1e-7, None),
    (POI, 10, 30, 1e-7, None),
    (POI, 10000000, 0, 1e-7, None),
    (POI, 10000000, 3, 1e-7, None),
    (POI, 1000, 0, 0.69, None),
    (POI, 2000000, 220, 0.0001, None),
    (POI, 10000000, 9000, 0.001, None),
    (POI, 10000000, 10000, 0.001, None),
    (POI, 10000000, 11500, 0.001, None),
    (POI, 10000000, 10000, 0.001417, None),  # cdf ~ 1e-300
    (POI, 100, 10, 1.0, None),
    (POI, 400, 900, 1.0, None),
    # hypergeometric: small lots, D small and large, n close to N, huge lots
    _hg(10, 1, 5, 50),
    _hg(5, 0, 1, 20),
    _hg(20, 15, 990, 1000),
    _hg(20, 9, 990, 1000),
    _hg(995, 45, 50, 1000),
    _hg(995, 47, 50, 1000),
    _hg(999, 0, 1, 1000),
    _hg(100, 2, 40, 1000),
    _hg(500, 5, 10, 10000),
    _hg(1000, 0, 3, 100000000),
    _hg(1000000, 0, 3, 100000000),
    _hg(1000000, 2, 3, 100000000),
    _hg(1000000, 100, 10000, 100000000),
    _hg(1000000, 0, 10000, 100000000),
    _hg(1000000, 300, 10000, 100000000),
    _hg(1000000, 10000, 1000000, 100000000),
    _hg(1000000, 6560, 1000000, 100000000),  # cdf ~ 1e-300
    _hg(1000000, 13880, 1000000, 100000000),  # sf ~ 1e-300
    _hg(10000, 5000, 50000000, 100000000),
    _hg(9999995, 5, 10, 10000000),
    _hg(2000, 100, 25000, 100000),
    _hg(2000, 1200, 50000, 100000),
    (HYP, 10, 0, 0.01, 50),  # p N = 0.5 exactly: rounds up to D = 1
    (HYP, 10, 1, 0.05, 50),  # p N = 2.5: D = 3
    (HYP, 20, 6, 0.29, 50),  # p N = 14.499999999999998 in binary64, meant 14.5: D = 15
]

# (model, p1, alpha, p2, beta, lot_size)
DESIGN_CASES = [
    (BIN, 0.001, 0.05, 0.01, 0.10, None),
    (BIN, 0.001, 0.05, 0.005, 0.10, None),
    (BIN, 0.005, 0.05, 0.02, 0.10, None),
    (BIN, 0.01, 0.05, 0.06, 0.10, None),
    (BIN, 0.01, 0.05, 0.05, 0.10, None),
    (BIN, 0.02, 0.05, 0.08, 0.10, None),
    (BIN, 0.05, 0.05, 0.10, 0.10, None),
    (BIN, 0.05, 0.05, 0.25, 0.10, None),
    (BIN, 0.002, 0.05, 0.03, 0.10, None),
    (BIN, 0.01, 0.01, 0.03, 0.05, None),
    (BIN, 0.02, 0.10, 0.06, 0.20, None),
    (BIN, 0.001, 0.01, 0.002, 0.05, None),
    (BIN, 0.03, 0.01, 0.09, 0.05, None),
    (BIN, 0.0001, 0.05, 0.000125, 0.10, None),
    (POI, 0.001, 0.05, 0.01, 0.10, None),
    (POI, 0.001, 0.05, 0.005, 0.10, None),
    (POI, 0.005, 0.05, 0.02, 0.10, None),
    (POI, 0.01, 0.05, 0.06, 0.10, None),
    (POI, 0.01, 0.05, 0.05, 0.10, None),
    (POI, 0.02, 0.05, 0.08, 0.10, None),
    (POI, 0.05, 0.05, 0.10, 0.10, None),
    (POI, 0.05, 0.05, 0.25, 0.10, None),
    (POI, 0.002, 0.05, 0.03, 0.10, None),
    (POI, 0.01, 0.01, 0.03, 0.05, None),
    (POI, 0.02, 0.10, 0.06, 0.20, None),
    (POI, 0.0001, 0.05, 0.000125, 0.10, None),
    # Poisson with several nonconformities per unit: n_min(c) can repeat, so
    # the tie rule has real work to do, and feasibility can be non-monotone.
    (POI, 0.2, 0.05, 2.0, 0.05, None),  # n = 4: c = 2 and 3 qualify, rule picks 3
    (POI, 0.3, 0.05, 1.5, 0.05, None),  # n = 8: c = 5 and 6 qualify, rule picks 5
    (POI, 0.5, 0.05, 0.75, 0.10, None),  # feasibility in c goes ...T F T...
    (POI, 1.0, 0.05, 1.5, 0.10, None),  # the plan needs c >= n (several nonconformities per unit)
    (HYP, 0.02, 0.05, 0.10, 0.10, 50),
    (HYP, 0.01, 0.05, 0.015, 0.10, 50),  # D1 = D2 = 1: no plan
    (HYP, 2 / 30, 0.01, 0.10, 0.01, 30),  # D1 = 2, D2 = 3: n = N
    (HYP, 0.02, 0.05, 0.04, 0.10, 50),  # D1 = 1, D2 = 2: nearly 100 %
    (HYP, 0.01, 0.05, 0.05, 0.10, 100),
    (HYP, 0.02, 0.05, 0.08, 0.10, 200),
    (HYP, 0.01, 0.05, 0.06, 0.10, 500),
    (HYP, 0.01, 0.05, 0.05, 0.10, 1000),
    (HYP, 0.01, 0.01, 0.05, 0.05, 1000),
    (HYP, 0.02, 0.10, 0.06, 0.20, 2000),
    (HYP, 0.005, 0.05, 0.02, 0.10, 5000),
    (HYP, 0.01, 0.05, 0.03, 0.10, 10000),
    (HYP, 0.001, 0.05, 0.01, 0.10, 100000),
    (HYP, 0.01, 0.05, 0.02, 0.10, 1000000),
    (HYP, 0.001, 0.05, 0.005, 0.10, 1000000),
]

# (model, n, c, lot_size, p)
MEASURE_CASES = (
    [(BIN, 50, 1, None, p) for p in (0.001, 0.01, 0.03, 0.05, 0.1, 0.3)]
    + [(BIN, 125, 3, 2000, p) for p in (0.005, 0.02, 0.05)]
    + [(BIN, 200, 4, None, p) for p in (0.01, 0.02, 0.05)]
    + [(BIN, 13, 0, 500, 0.05), (BIN, 1000, 10, 10**6, 0.01), (BIN, 2000000, 220, None, 0.0001),
       (BIN, 20, 19, None, 0.9), (BIN, 3000, 5, None, 1e-6)]
    + [(POI, 50, 1, None, p) for p in (0.001, 0.01, 0.03, 0.05, 0.1, 0.3)]
    + [(POI, 125, 3, 2000, p) for p in (0.005, 0.02, 0.05)]
    + [(POI, 2000000, 220, None, 0.0001), (POI, 100, 2, None, 1.5)]
    + [(HYP, 10, 1, 50, p) for p in (0.02, 0.1, 0.2, 0.5)]
    + [(HYP, 13, 0, 500, 0.05), (HYP, 125, 3, 2000, 0.02), (HYP, 48, 1, 50, 0.04),
       (HYP, 49, 2, 50, 0.9), (HYP, 80, 2, 1000, 0.0005), (HYP, 200, 5, 100000, 0.01),
       (HYP, 10, 2, 50, 0.03), (HYP, 10, 0, 50, 0.01)]
    # Issue 14, item 2: 2.29% to 2.33% in a lot of 2000 (D = 46, 46, 46, 46,
    # 47); item 8: the AQL 0.65% in a lot of 300 (D = 2, D/N = 0.6667%).
    + [(HYP, 125, 3, 2000, p) for p in (0.0229, 0.023, 0.0231, 0.0232, 0.0233)]
    + [(HYP, 94, 2, 300, 0.0065), (HYP, 94, 2, 300, 0.018027756377319945)]
)

# Risks at the end of double precision (issue 14, item 4): 1 - alpha
# rounds to 1 below about 1e-16. (binomial, 1%, 5e-17; 99%, 0.10) is n = 9,
# c = 8 by hand: P(X = 9) = 0.01^9 = 1e-18 <= 5e-17, while n = 8, c = 7
# gives 1e-16.
EXTREME_DESIGN_CASES = [
    (BIN, 0.01, 5e-17, 0.99, 0.10, None),
    (BIN, 0.01, 1e-30, 0.99, 1e-30, None),
    (BIN, 0.01, 1e-30, 0.90, 1e-30, None),
    (BIN, 0.05, 1e-30, 0.95, 1e-30, None),
    (BIN, 0.01, 1e-30, 0.50, 1e-30, None),
    (POI, 0.1, 1e-30, 2.0, 1e-30, None),
    (POI, 0.01, 5e-17, 1.5, 0.10, None),
    (HYP, 0.05, 1e-30, 0.5, 1e-30, 1000),
    (HYP, 0.05, 5e-17, 0.3, 0.10, 200),
]

# (model, n, c, lot_size)
AOQL_CASES = [
    (BIN, 50, 1, None), (BIN, 125, 3, 2000), (BIN, 200, 4, None), (BIN, 13, 0, None),
    (BIN, 1000, 10, None), (BIN, 2000000, 220, None),
    (POI, 50, 1, None), (POI, 125, 3, 2000), (POI, 13, 0, None), (POI, 1000, 10, None),
    (HYP, 10, 1, 50), (HYP, 13, 0, 500), (HYP, 125, 3, 2000), (HYP, 200, 4, 10000),
    (HYP, 48, 1, 50), (HYP, 94, 2, 300),
]

INDIFFERENCE_CASES = [
    (BIN, 50, 1, None), (BIN, 125, 3, None), (BIN, 200, 4, None), (BIN, 13, 0, None),
    (BIN, 2000000, 220, None),
    (POI, 50, 1, None), (POI, 125, 3, None), (POI, 13, 0, None), (POI, 10000, 100, None),
    (HYP, 10, 1, 50), (HYP, 13, 0, 500), (HYP, 125, 3, 2000), (HYP, 1000, 10, 100000),
    (HYP, 49, 0, 50),
]


# --------------------------------------------------------------------------
# Building the fixture
# --------------------------------------------------------------------------


def build_tails(notes):
    """Tail rows; Poisson rows are additionally cross-checked by summation."""
    rows = []
    for model, n, c, p, lot in TAIL_CASES:
        cdf, sf = mp_tails(model, n, c, p, lot)
        assert abs(cdf + sf - 1) < mpf(10) ** -45, (model, n, c, p, lot)
        if model == POI:
            c2, s2 = mp_poisson_tails_sum(mpf(n) * mpf(p), c)
            for a, b in ((cdf, c2), (sf, s2)):
                assert a == b == 0 or abs(a - b) <= mpf(10) ** -40 * abs(a), (n, c, p)
        fc, fs = to_float(cdf), to_float(sf)
        if 0 < min(cdf, sf) < mpf("2.2250738585072014e-308"):
            notes.append(f"tails row {model} n={n} c={c} p={p}: tail {mp.nstr(min(cdf, sf), 5)}"
                         " is below the normal binary64 range")
        rows.append(dict(model=model, n=n, c=c, p=p, lot_size=lot, cdf=fc, sf=fs))
    return rows


def build_designs(notes, margins):
    """Design rows (scipy search) with 50-digit re-checks of every boundary."""
    rows = []
    for model, p1, alpha, p2, beta, lot in DESIGN_CASES:
        prob = DesignProblem(model, p1, alpha, p2, beta, lot)
        res = prob.solve()
        tag = f"{model} p1={p1} a={alpha} p2={p2} b={beta} N={lot}"
        c_top = (res["c"] + 3) if res["n"] is not None else 3
        alts, feas, near = [], [], []
        for c in range(c_top + 1):
            nmn, nmx = prob.n_min(c), prob.n_max(c)
            for field in mp_verify_alternative(prob, c, nmn, nmx, margins):
                near.append(dict(c=c, field=field))
                notes.append(f"design {tag}: c={c} {field} sits on an exact/near tie")
            alts.append(dict(c=c, n_min=nmn, n_max=nmx))
            feas.append(nmn is not None and nmx is not None and nmn <= nmx)
        row = dict(model=model, p1=p1, alpha=alpha, p2=p2, beta=beta, lot_size=lot,
                   alternatives=alts, near_ties=near)
        if res["n"] is None:
            row.update(n=None, c=None, producer_risk=None, consumer_risk=None,
                       reason="no_plan")
            assert not any(feas)
            notes.append(f"design {tag}: no plan")
        else:
            n, c = res["n"], res["c"]
            cdf1, sf1 = mp_tails(model, n, c, p1, lot)
            cdf2, _ = mp_tails(model, n, c, p2, lot)
            assert cdf1 >= 1 - mpf(alpha) and cdf2 <= mpf(beta), tag
            for v, t, f in ((cdf1, 1 - mpf(alpha), "producer_risk"),
                            (cdf2, mpf(beta), "consumer_risk")):
                if abs(v - t) < NEAR_TIE * t:
                    near.append(dict(c=c, field=f))
            pr, cr = to_float(sf1), to_float(cdf2)
            for a, b in ((pr, res["producer_risk"]), (cr, res["consumer_risk"])):
                assert abs(a - b) <= 1e-9 * max(abs(a), 1e-300), (tag, a, b)
                if a:
                    notes.append(("scipy_vs_mpmath", abs(a - b) / abs(a), tag))
            row.update(n=n, c=c, producer_risk=pr, consumer_risk=cr, reason=None)
            assert min(a["n_min"] for a, f in zip(alts, feas) if f) == n, tag
            assert alts[-1]["n_min"] is None or alts[-1]["n_min"] > n or model == HYP, tag
            smallest = min(i for i, f in enumerate(feas) if f)
            if smallest != c:
                notes.append(f"design {tag}: n={n}, smallest feasible c={smallest} but tie"
                             f" rule picks c={c}")
            if len(res["ties"]) > 1:
                sc = [f"c={t[1]}:{t[0]:.6g}" for t in res["ties"]]
                notes.append(f"design {tag}: {len(res['ties'])} c meet both points at n={n}"
                             f" (scores {', '.join(sc)})")
                if res["ties"][1][0] - res["ties"][0][0] <= 1e-9 * res["ties"][0][0]:
                    notes.append(f"design {tag}: tie-rule scores (near-)equal")
                    near.append(dict(c=c, field="tie_rule"))
            # look past the alternatives window for non-monotone feasibility
            seen_true, pattern = False, []
            for cc in range(min(c_top + 25, (lot or 10**12))):
                nmn = prob.n_min(cc)
                if nmn is None:
                    break  # no larger c can meet the consumer's point in this lot
                f = prob.producer_ok(nmn, cc)
                pattern.append("T" if f else "F")
                if seen_true and not f:
                    notes.append(f"design {tag}: feasibility non-monotone in c: "
                                 f"{''.join(pattern)}")
                    break
                seen_true |= f
        rows.append(row)
    return rows


def build_fixture(notes, margins):
    """Assemble the whole fixture as a plain dict."""
    return {
        "tails": build_tails(notes),
        "designs": build_designs(notes, margins),
        "measures": [measures_row(*case) for case in MEASURE_CASES],
        "aoql": [dict(model=m, n=n, c=c, lot_size=L,
                      **dict(zip(("aoql", "quality"), mp_aoql(m, n, c, L))))
                 for m, n, c, L in AOQL_CASES],
        "indifference": [dict(model=m, n=n, c=c, lot_size=L, quality=mp_indifference(m, n, c, L))
                         for m, n, c, L in INDIFFERENCE_CASES],
        "poisson_unity": [poisson_unity_row(c, 0.05, 0.10) for c in range(16)],
        "extreme_designs": [extreme_design_row(*case) for case in EXTREME_DESIGN_CASES],
    }


def render(fixture) -> str:
    """Deterministic JSON text: sorted keys, repr floats, trailing newline."""
    return json.dumps(fixture, sort_keys=True, indent=1, allow_nan=False) + "\n"


# --------------------------------------------------------------------------
# Self-test: brute force against the closed forms and the fast search
# --------------------------------------------------------------------------


def _exact_binom_tails(n, c, p: Fraction):
    pmf = [math.comb(n, k) * p**k * (1 - p) ** (n - k) for k in range(n + 1)]
    return sum(pmf[: c + 1], Fraction(0)), sum(pmf[c + 1:], Fraction(0))


def _exact_hyper_tails(N, D, n, c):
    tot = math.comb(N, n)
    pmf = [Fraction(math.comb(D, k) * math.comb(N - D, n - k), tot) for k in range(n + 1)]
    return sum(pmf[: max(c + 1, 0)], Fraction(0)), sum(pmf[max(c + 1, 0):], Fraction(0))


def _exact_hyper_tails_sparse(N, D, n, c):
    """Exact hypergeometric tails summing only the support (big integers)."""
    lo, hi = max(0, n - (N - D)), min(n, D)
    tot = math.comb(N, n)
    terms = {k: math.comb(D, k) * math.comb(N - D, n - k) for k in range(lo, hi + 1)}
    cdf = sum(v for k, v in terms.items() if k <= c)
    return Fraction(cdf, tot), Fraction(tot - cdf, tot)


def _brute_curtailed_binom(n, c, p: Fraction):
    """E[units inspected] by enumerating all 2^n outcome sequences."""
    total = Fraction(0)
    for seq in itertools.product((0, 1), repeat=n):  # 1 = nonconforming
        prob, bad, good, stop = Fraction(1), 0, 0, None
        for i, x in enumerate(seq, 1):
            prob *= p if x else 1 - p
            bad, good = bad + x, good + 1 - x
            if stop is None and (bad == c + 1 or good == n - c):
                stop = i
        total += prob * stop
    return total


def _brute_curtailed_hyper(N, D, n, c):
    """E[units inspected] enumerating all ordered draw sequences w/o replacement."""
    total = Fraction(0)
    for seq in itertools.product((0, 1), repeat=n):
        prob, bad, good, stop = Fraction(1), 0, 0, None
        for i, x in enumerate(seq, 1):
            left = N - i + 1
            prob *= Fraction(D - bad, left) if x else Fraction(N - D - good, left)
            if prob == 0:
                break
            bad, good = bad + x, good + 1 - x
            if stop is None and (bad == c + 1 or good == n - c):
                stop = i
        if prob:
            total += prob * stop
    return total


def _close(a, b, tol=mpf(10) ** -40):
    """Relative agreement of two numbers (exact equality required at 0)."""
    a, b = mpf(a), (mpf(b.numerator) / b.denominator if isinstance(b, Fraction) else mpf(b))
    return a == b if b == 0 else abs(a - b) <= tol * abs(b)


def self_test():
    """Run all cross-checks; raises AssertionError on the first failure."""
    t0 = time.time()

    # 1. 50-digit tails against exact rational arithmetic.
    for n in (1, 2, 7, 30):
        for p in (0.001, 0.1, 0.37, 0.9):
            for c in range(-1, n + 1):
                ec, es = _exact_binom_tails(n, c, Fraction(p))
                mc, ms = mp_binom_tails(n, c, p)
                assert _close(mc, ec) and _close(ms, es), (n, c, p)
    for N in (1, 5, 12, 40):
        for D in range(N + 1):
            for n in range(1, N + 1):
                for c in range(-1, n + 1):
                    ec, es = _exact_hyper_tails(N, D, n, c)
                    mc, ms = mp_hyper_tails(N, D, n, c)
                    assert _close(mc, ec) and _close(ms, es), (N, D, n, c)
    # Large lots against exact big-integer arithmetic (scipy 1.17.1's
    # hypergeom is only ~1e-10 relative here; the 50-digit sums are exact).
    for N, D, n, c in ((10**6, 5000, 1334, 3), (10**6, 10000, 1235, 18), (10**8, 3, 10**4, 0),
                       (10**7, 10, 9999995, 5)):
        ec, es = _exact_hyper_tails_sparse(N, D, n, c)
        mc, ms = mp_hyper_tails(N, D, n, c)
        assert _close(mc, ec) and _close(ms, es), (N, D, n, c)
    # Binomial summation vs mpmath betainc where betainc converges quickly.
    for n, c, p in ((20, 3, 0.1), (1000, 10, 0.01), (2000000, 220, 0.0001),
                    (10**7, 5, 1e-7), (10**7, 30, 1e-6), (1000, 900, 0.5)):
        mc, ms = mp_binom_tails(n, c, p)
        bc = mp.betainc(n - c, c + 1, 0, 1 - mpf(p), regularized=True)
        assert _close(mc, bc), (n, c, p)
    for n, c, p in ((1000, 900, 0.5), (10**7, 2000, 1e-4), (20, 3, 0.1)):
        ms = mp_binom_tails(n, c, p)[1]
        bs = mp.betainc(c + 1, n - c, 0, mpf(p), regularized=True)
        assert _close(ms, bs), (n, c, p)
    # Poisson gammainc vs summation.
    for lam in ("1e-6", "0.5", "7.25", "100", "10000"):
        for c in (0, 3, 50, 9000, 10000, 11500):
            a, b = mp_poisson_tails(mpf(lam), c), mp_poisson_tails_sum(mpf(lam), c)
            for x, y in zip(a, b):
                assert _close(x, y), (lam, c)
    print("self-test: tails OK")

    # 2. Curtailed ASN closed forms against enumeration.
    k = 0
    for n in range(1, 9):
        for c in range(n):
            for p in (Fraction(1, 10), Fraction(1, 3), Fraction(3, 4)):
                brute = _brute_curtailed_binom(n, c, p)
                closed = (c + 1) / p * _exact_binom_tails(n + 1, c + 1, p)[1] \
                    + (n - c) / (1 - p) * _exact_binom_tails(n + 1, c, p)[0]
                assert brute == closed, (n, c, p, brute, closed)
                pf = float(p)
                mpv = mp_asn_curtailed(BIN, n, c, pf)
                ex = _brute_curtailed_binom(n, c, Fraction(pf))
                assert _close(mpv, ex), (n, c, pf)
                k += 1
    for N in range(1, 10):
        for D in range(N + 1):
            for n in range(1, N + 1):
                for c in range(n):
                    brute = _brute_curtailed_hyper(N, D, n, c)
                    closed = Fraction((c + 1) * (N + 1), D + 1) \
                        * _exact_hyper_tails(N + 1, D + 1, n + 1, c + 1)[1] \
                        + Fraction((n - c) * (N + 1), N - D + 1) \
                        * _exact_hyper_tails(N + 1, D, n + 1, c)[0]
                    assert brute == closed, (N, D, n, c, brute, closed)
                    mpv = mp_asn_curtailed(HYP, n, c, D / N, N)
                    assert _close(mpv, brute), (N, D, n, c)
                    k += 1
    print(f"self-test: curtailed ASN closed forms OK ({k} cases)")

    # 3. Design search against a naive scan over all n and c.
    k = 0
    for model in (BIN, POI):
        for p1 in (0.01, 0.02, 0.05, 0.1):
            for ratio in (2, 3, 5, 8):
                for alpha, beta in ((0.05, 0.10), (0.01, 0.05), (0.10, 0.20)):
                    p2 = p1 * ratio
                    if model == BIN and p2 >= 1:
                        continue
                    prob = DesignProblem(model, p1, alpha, p2, beta)
                    res = prob.solve()
                    if res["n"] > 400:
                        continue
                    assert naive_design(prob, 450) == (res["n"], res["c"]), prob.__dict__
                    for c in range(res["c"] + 4):
                        _check_alternative_naive(prob, c)
                    k += 1
    # Poisson with several nonconformities per unit: repeated n_min(c), real
    # tie-rule decisions, and plans with c >= n.
    ties = 0
    for p1 in (0.2, 0.3, 0.5, 1.0):
        for ratio in (1.5, 2, 3, 5, 10):
            for alpha, beta in ((0.05, 0.10), (0.05, 0.05), (0.10, 0.20), (0.20, 0.30)):
                prob = DesignProblem(POI, p1, alpha, p1 * ratio, beta)
                res = prob.solve()
                if res["n"] is not None and res["n"] > 400:
                    continue
                assert naive_design(prob, 450) == (res["n"], res["c"]), prob.__dict__
                for c in range((res["c"] or 0) + 4):
                    _check_alternative_naive(prob, c)
                ties += len(res["ties"]) > 1
                k += 1
    assert ties > 0
    for N in (5, 10, 20, 30, 50, 80, 120):
        for d1 in range(0, 6):
            for d2 in range(d1 + 1, d1 + 12):
                if d2 > N:
                    continue
                for alpha, beta in ((0.05, 0.10), (0.01, 0.05), (0.10, 0.20)):
                    prob = DesignProblem(HYP, d1 / N, alpha, d2 / N, beta, N)
                    res = prob.solve()
                    assert naive_design(prob, N) == (res["n"], res["c"]), prob.__dict__
                    for c in range((res["c"] or 0) + 4):
                        _check_alternative_naive(prob, c)
                    k += 1
    print(f"self-test: design vs naive scan OK ({k} problems)")

    # 4. AOQL / indifference sanity against dense double-precision grids.
    for m, n, c, L in AOQL_CASES:
        if m == HYP or n > 10**5:
            continue
        aoql, q = mp_aoql(m, n, c, L)
        f = (1.0 if L is None else (L - n) / L)
        grid = np.linspace(1e-9, q * 3, 200001)
        cdf = st.binom.cdf(c, n, grid) if m == BIN else st.poisson.cdf(c, n * grid)
        g = float(np.max(cdf * grid * f))
        assert g <= aoql * (1 + 1e-12) and g >= aoql * (1 - 1e-8), (m, n, c, aoql, g)
    for m, n, c, L in AOQL_CASES:  # hypergeometric: exact scan over every D
        if m == HYP and L <= 2000:
            vals = [(_exact_hyper_tails(L, D, n, c)[0] * Fraction(D, L) * Fraction(L - n, L), D)
                    for D in range(L + 1)]
            v, D = max(vals)
            assert mp_aoql(m, n, c, L) == (float(v), float(Fraction(D, L))), (n, c, L)
    for m, n, c, L in INDIFFERENCE_CASES:
        q = mp_indifference(m, n, c, L)
        if m != HYP:
            assert abs(mp_tails(m, n, c, q, L)[0] - mpf(0.5)) < 1e-12
        elif L <= 2000:
            D = next(D for D in range(L + 1) if _exact_hyper_tails(L, D, n, c)[0] <= Fraction(1, 2))
            assert q == float(Fraction(D, L)), (n, c, L)
    assert lot_defectives(0.01, 50) == 1 and lot_defectives(0.29, 50) == 15
    assert lot_defectives(0.05, 50) == 3 and lot_defectives(1.2, 50) == 50
    print(f"self-test: AOQL / indifference OK; all passed in {time.time() - t0:.1f} s")


def _check_alternative_naive(prob: DesignProblem, c):
    """n_min / n_max of one c against linear scans."""
    cap = prob.n_cap or 100000
    nmn = next((n for n in range(prob.smallest_n(c), cap + 1) if prob.consumer_ok(n, c)), None)
    assert prob.n_min(c) == nmn, (prob.__dict__, c)
    ok = [n for n in range(1, min(cap, (prob.n_max(c) or 0) + 3) + 1) if prob.producer_ok(n, c)]
    assert prob.n_max(c) == (max(ok) if ok else None), (prob.__dict__, c)


# --------------------------------------------------------------------------
# Benchmark
# --------------------------------------------------------------------------


def bench():
    """Time the scipy-based exact design and a vectorised OC curve."""
    def timed(fn, repeats):
        ts = []
        for _ in range(repeats):
            t = time.perf_counter()
            out = fn()
            ts.append(time.perf_counter() - t)
        return statistics.median(ts), out

    cases = [
        ("binomial p1=0.01 a=0.05 p2=0.06 b=0.10", (BIN, 0.01, 0.05, 0.06, 0.10, None), 200),
        ("binomial p1=0.0001 a=0.05 p2=0.000125 b=0.10", (BIN, 0.0001, 0.05, 0.000125, 0.10,
                                                           None), 5),
        ("hypergeometric N=1e6 p1=0.01 a=0.05 p2=0.02 b=0.10", (HYP, 0.01, 0.05, 0.02, 0.10,
                                                                10**6), 20),
    ]
    for label, args, reps in cases:
        med, res = timed(lambda: DesignProblem(*args).solve(), reps)
        print(f"bench design {label}: median {med * 1e3:.3f} ms over {reps} runs "
              f"(n={res['n']}, c={res['c']})")
    grid = np.linspace(0.0, 0.1, 1001)
    med, _ = timed(lambda: st.binom.cdf(4, 200, grid), 500)
    print(f"bench OC curve binomial n=200 c=4, 1001 points (scipy.stats.binom.cdf vectorised):"
          f" median {med * 1e6:.1f} us over 500 runs")


# --------------------------------------------------------------------------
# Main
# --------------------------------------------------------------------------


def parse_args(argv, doc):
    """The command line shared by the fixture scripts."""
    ap = argparse.ArgumentParser(description=doc.split("\n\n")[0])
    g = ap.add_mutually_exclusive_group()
    g.add_argument("--check", action="store_true",
                   help="exit 1 if the fixture on disk differs from what would be written")
    g.add_argument("--bench", action="store_true", help="print timings, write nothing")
    g.add_argument("--self-test", action="store_true", help="run brute-force cross-checks")
    ap.add_argument("--verbose", action="store_true", help="print build notes")
    return ap.parse_args(argv)


def write_or_check(fixture, text, script, check):
    """Write the fixture, or with ``check`` exit status 1 if it would change."""
    if check:
        old = fixture.read_bytes() if fixture.exists() else b""
        if old != text.encode():
            print(f"{fixture.relative_to(REPO)} is out of date; rerun {script}",
                  file=sys.stderr)
            return 1
        print(f"{fixture.relative_to(REPO)} is up to date")
        return 0
    fixture.parent.mkdir(parents=True, exist_ok=True)
    fixture.write_text(text)
    print(f"wrote {fixture.relative_to(REPO)}")
    return 0


def main(argv=None):
    args = parse_args(argv, __doc__)

    if args.bench:
        bench()
        return 0
    if args.self_test:
        self_test()
        return 0

    t0 = time.time()
    notes, margins = [], []
    text = render(build_fixture(notes, margins))
    if args.verbose:
        diffs = [n for n in notes if isinstance(n, tuple)]
        for line in notes:
            if not isinstance(line, tuple):
                print("note:", line)
        worst = max(diffs, key=lambda d: d[1])
        print(f"note: largest scipy/mpmath relative difference in a design risk: "
              f"{worst[1]:.2e} ({worst[2]})")
        margins.sort()
        for m in [m for m in margins if m[0] >= NEAR_TIE][:3]:
            print("note: tightest boundary margin above the near-tie level",
                  mp.nstr(m[0], 3), m[1:])
        print(f"built in {time.time() - t0:.1f} s with scipy {scipy.__version__}, "
              f"numpy {np.__version__}, mpmath {mpmath.__version__}")
    return write_or_check(FIXTURE, text, "make_reference.py", args.check)


if __name__ == "__main__":
    sys.exit(main())
