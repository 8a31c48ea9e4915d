#!/usr/bin/env python3
"""Independent reference values for lotsman's minimum-inspection plans
(rectifying inspection, Dodge and Romig's method).

Writes ``tests/data/minimum_reference.json`` by exhaustive search over small
lots, using only general-purpose numerical libraries: scipy.stats in double
precision to decide which plans give the protection and which inspects
least, mpmath at 50 significant digits for every stored probability and
measure and for any decision that falls within 1e-9 of its limit.  Nothing
here comes from any acceptance-sampling package.  The 50-digit tails,
``lot_defectives``, ``mp_aoql`` and ``render`` come from
``make_reference.py``; the 50-digit stage recursion ``mp_stage_dp`` from
``make_staged_reference.py``.

Usage (from the repository root)::

    python3 tests/reference/make_minimum_reference.py             # (re)write the fixture
    python3 tests/reference/make_minimum_reference.py --check     # exit 1 if it would change
    python3 tests/reference/make_minimum_reference.py --bench     # print timings, write nothing
    python3 tests/reference/make_minimum_reference.py --self-test # brute-force cross-checks

Conventions (mirrored by the Rust code):

* a lot of N units at quality p; hypergeometric lots hold
  ``D = lot_defectives(p, N)`` nonconforming units and their qualities are
  D / N; Poisson counts nonconformities with mean n p (n p formed in
  binary64);
* rectifying inspection: ``S(p) = sum_j acc_j (N - n_j)`` units are saved
  against 100% inspection, ``ATI(p) = N - S(p)``, ``AOQ(p) = p S(p) / N``;
  for a single plan ``ATI = N - Pa (N - n)``;
* protection "ltpd": ``Pa(p_t) <= beta``; "aoql": ``max_p AOQ(p) <= L``
  (hypergeometric: the maximum over every D = 0..N at p = D / N);
  alpha-like limits are taken as their exact binary64 values;
* a sampling plan beats 100% inspection only when its ATI is below
  ``N (1 - 1e-12)``; ATIs within 1e-12 (relative) tie.  Single plans: the
  scan over c keeps the earlier c on a tie (so the smaller n).  Double
  plans: the smaller n1 + n2, then the smaller (c2, c1, r1, n1);
* double plans take Dodge and Romig's form: accept at d1 <= c1, reject at
  d1 >= r1 = c2 + 1, otherwise n2 more units and accept at a cumulative
  count <= c2; c1 < c2, n1, n2 >= 1, n1 + n2 <= N (unit-count models:
  n1 > c1 and n1 + n2 > c2).

The output is deterministic: keys sorted, floats written with ``repr``, no
timestamps or versions in the data.
"""

from __future__ import annotations

import itertools
import math
import sys
import time
from pathlib import Path

import mpmath
import numpy as np
import scipy
import scipy.stats as st
from scipy.special import gammaln
from mpmath import mp, mpf

sys.path.insert(0, str(Path(__file__).resolve().parent))
import make_reference as ref  # noqa: E402  (sets mp.dps = 50)
from make_reference import (  # noqa: E402
    BIN, HYP, POI, lot_defectives, mp_aoql, mp_tails, parse_args, render, to_float,
    write_or_check,
)
from make_staged_reference import mp_stage_dp  # noqa: E402

REPO = Path(__file__).resolve().parents[2]
FIXTURE = REPO / "tests" / "data" / "minimum_reference.json"

#: Relative width within which two ATIs tie.
TIE = 1e-12
#: Relative distance from a limit inside which a double-precision decision
#: is taken again at 50 digits (and recorded as a near tie).
MARGIN = 1e-9
#: Print each case's time as it is built (--verbose).
VERBOSE = False
#: The probability of acceptance at which an AOQL plan's LTPD is read.
AOQL_PLAN_RISK = 0.10

assert mp.dps == ref.MP_DPS == 50


# --------------------------------------------------------------------------
# Double-precision building blocks (scipy), vectorised
# --------------------------------------------------------------------------


def quality_param(model, p, N):
    """p itself, or D = lot_defectives(p, N) for the hypergeometric model."""
    return lot_defectives(p, N) if model == HYP else p


def _ln_choose(a, b):
    return gammaln(a + 1) - gammaln(b + 1) - gammaln(a - b + 1)


def hyper_terms(k, N, D, n):
    """P(X = j) for j = 0..max(k) on a new first axis, for X hypergeometric
    (lot N, D nonconforming, sample n; arrays broadcast), from log-gamma
    (scipy.special.gammaln).  Terms outside the support are 0.  (scipy
    1.17.1's hypergeom.cdf costs about 12 us per value when D varies; these
    sums agree with it to 3e-11 relative and cost 50 times less.)"""
    shape = np.broadcast(k, N, D, n).shape
    j = np.arange(int(np.max(k)) + 1).reshape((-1,) + (1,) * len(shape))
    ok = (j <= D) & (n - j <= N - D) & (j <= n)
    with np.errstate(invalid="ignore", divide="ignore"):
        ln = _ln_choose(D, j) + _ln_choose(N - D, n - j) - _ln_choose(N, n)
        return np.where(ok, np.exp(np.where(ok, ln, 0.0)), 0.0)


def _hyper_sum(k, n, q, N, keep):
    """The sum of the hypergeometric terms P(X = j) over the j where
    ``keep(j, k)`` holds (``np.less_equal`` for the cdf, ``np.equal`` for
    the pmf)."""
    terms = hyper_terms(k, N, q, n)
    j = np.arange(terms.shape[0]).reshape((-1,) + (1,) * (terms.ndim - 1))
    return np.where(keep(j, k), terms, 0.0).sum(axis=0)


def cdf(model, k, n, q, N):
    """P(X <= k) for the count in n units at quality parameter q (arrays broadcast)."""
    if model == BIN:
        return st.binom.cdf(k, n, q)
    if model == POI:
        return st.poisson.cdf(k, np.asarray(n, dtype=float) * q)
    return _hyper_sum(k, n, q, N, np.less_equal)


def pmf(model, k, n, q, N):
    """P(X = k), as :func:`cdf`."""
    if model == BIN:
        return st.binom.pmf(k, n, q)
    if model == POI:
        return st.poisson.pmf(k, np.asarray(n, dtype=float) * q)
    return _hyper_sum(k, n, q, N, np.equal)


class Problem:
    """One minimum-inspection request: model, lot size N, process average
    ``pbar`` and the protection (``kind`` "ltpd" with ``quality`` p_t and
    ``beta``, or "aoql" with ``quality`` L)."""

    def __init__(self, model, N, pbar, kind, quality, beta=None):
        self.model, self.N, self.pbar = model, N, pbar
        self.kind, self.quality, self.beta = kind, quality, beta
        self.unit = model != POI
        self.q_bar = quality_param(model, pbar, N)
        self.near = []  # near-tie decisions, retaken at 50 digits

    def key(self):
        return dict(model=self.model, lot_size=self.N, process_average=self.pbar,
                    protection=self.kind, quality=self.quality, beta=self.beta)

    def smallest_n(self, c):
        return c + 1 if self.unit else 1

    # ---- single plans --------------------------------------------------

    def ati(self, n, c):
        """ATI(p̄) of single plans (n, c), arrays broadcast."""
        pa = cdf(self.model, c, n, self.q_bar, self.N)
        return self.N - pa * (self.N - np.asarray(n, dtype=float))

    def aoq_single(self, n, c, q):
        """AOQ at quality parameter q (p, or D for the hypergeometric model)."""
        p = q / self.N if self.model == HYP else q
        return cdf(self.model, c, n, q, self.N) * p * (self.N - np.asarray(n, dtype=float)) / self.N

    def aoql_lower_single(self, ns, c):
        """A lower bound on the AOQL of (n, c) for each n in ``ns``: the
        largest AOQ over 29 qualities x (c + 1) / n, x = 0.2 .. 1.6 (any
        quality gives a lower bound; these bracket the peak)."""
        x = np.linspace(0.2, 1.6, 29)[:, None]
        p = x * (c + 1) / ns[None, :].astype(float)
        if self.model == BIN:
            p = np.minimum(p, 1.0 - 1e-12)
        if self.model == HYP:
            q = np.clip(np.floor(p * self.N + 0.5), 0, self.N)
        else:
            q = p
        return self.aoq_single(ns[None, :], c, q).max(axis=0)

    def aoql_single(self, n, c):
        """(AOQL, quality) of (n, c) in double precision: every D for the
        hypergeometric model; otherwise a 4000-point grid up to where the
        expected count is 6 (c + 2), refined by golden section."""
        if self.model == HYP:
            D = np.arange(self.N + 1)
            v = self.aoq_single(n, c, D)
            i = int(np.argmax(v))
            return float(v[i]), float(D[i]) / self.N
        hi = 6.0 * (c + 2) / n
        if self.model == BIN:
            hi = min(hi, 1.0)
        grid = np.linspace(hi / 4000, hi, 4000)
        v = self.aoq_single(n, c, grid)
        i = int(np.argmax(v))
        assert i < len(grid) - 1, (n, c)
        f = lambda p: float(self.aoq_single(n, c, p))  # noqa: E731
        p = golden_max(f, grid[max(i - 1, 0)], grid[i + 1])
        return f(p), p

    def single_feasible(self, ns, c):
        """For each n in ``ns`` (increasing), whether (n, c) gives the
        protection; near ties retaken at 50 digits."""
        ns = np.asarray(ns)
        if self.kind == "ltpd":
            q_t = quality_param(self.model, self.quality, self.N)
            pa = cdf(self.model, c, ns, q_t, self.N)
            ok = pa <= self.beta
            for i in np.nonzero(np.abs(pa - self.beta) <= MARGIN * self.beta)[0]:
                n = int(ns[i])
                exact = mp_tails(self.model, n, c, self.quality, self.N)[0]
                ok[i] = exact <= mpf(self.beta)
                self.near.append(dict(what="ltpd", n=n, c=c))
            return ok
        ok = np.zeros(len(ns), dtype=bool)
        lower = self.aoql_lower_single(ns, c)
        for i in np.nonzero(lower <= self.quality)[0]:
            ok[i] = self.aoql_decides(int(ns[i]), c)
        return ok

    def protects_some(self, ns, c):
        """Whether some (n, c), n in ``ns``, may give the protection: for an
        LTPD, decided; for an AOQL, unless every lower bound exceeds L."""
        if self.kind == "ltpd":
            return bool(self.single_feasible(ns, c).any())
        return bool((self.aoql_lower_single(ns, c) <= self.quality).any())

    def aoql_decides(self, n, c):
        value, _ = self.aoql_single(n, c)
        if abs(value - self.quality) <= MARGIN * self.quality:
            self.near.append(dict(what="aoql", n=n, c=c))
            value = mp_aoql(self.model, n, c, self.N)[0]
        return value <= self.quality

    def n_min(self, c):
        """The smallest n <= N giving the protection with c, by testing every
        n from the smallest upward (no monotonicity assumed); None if none."""
        lo = self.smallest_n(c)
        block = 512
        for start in range(lo, self.N + 1, block):
            ns = np.arange(start, min(start + block, self.N + 1))
            if self.kind == "ltpd":
                ok = self.single_feasible(ns, c)
                if ok.any():
                    return int(ns[int(np.argmax(ok))])
                continue
            lower = self.aoql_lower_single(ns, c)
            for n in ns[lower <= self.quality]:
                if self.aoql_decides(int(n), c):
                    return int(n)
        return None


def golden_max(f, a, b, rel=1e-13):
    """Maximiser of a unimodal f on [a, b] by golden-section search, in
    double precision, or at mpmath's precision when a is an mpf."""
    g = ((mp.sqrt(5) if isinstance(a, mpf) else math.sqrt(5)) - 1) / 2
    x1, x2 = b - g * (b - a), a + g * (b - a)
    f1, f2 = f(x1), f(x2)
    while b - a > rel * b:
        if f1 < f2:
            a, x1, f1 = x1, x2, f2
            x2 = a + g * (b - a)
            f2 = f(x2)
        else:
            b, x2, f2 = x2, x1, f1
            x1 = b - g * (b - a)
            f1 = f(x1)
    return 0.5 * (a + b)


# --------------------------------------------------------------------------
# Single plans: the scan over c, and the box that proves it
# --------------------------------------------------------------------------


def single_scan(prob):
    """The designer's rule with an exhaustive n_min: rows
    (c, n_min, ATI) from c = 0 until n_min(c) reaches the best ATI or no n
    gives the protection; the best plan (n, c) or None (100% inspection)."""
    rows, best, best_ati = [], None, float(prob.N)
    for c in itertools.count():
        n = prob.n_min(c)
        if n is None:
            rows.append((c, None))
            break
        # at 50 digits, so that Pa(p̄) = 1 gives ATI = n exactly (the stop
        # below compares them)
        ati = to_float(mp_single_ati(prob, n, c))
        rows.append((c, n))
        if ati < best_ati * (1 - TIE):
            best, best_ati = (n, c), ati
        if n >= best_ati:
            break
    return rows, best, best_ati


def single_box(prob, best, best_ati):
    """Every plan (n, c) with n below the best ATI (every other plan has
    ATI >= n >= the best): none may give the protection with a smaller
    ATI.  c runs up until no n in range gives the protection (then no
    larger c does: Pa rises with c) or, for the unit-count models, c + 1
    reaches the best ATI.  Returns (plans examined, feasible plans tied
    with the best)."""
    top = min(prob.N, math.ceil(best_ati * (1 + TIE)))  # n < top
    examined, tied = 0, 0
    for c in itertools.count():
        lo = prob.smallest_n(c)
        if lo >= top:
            break
        ns = np.arange(lo, top)
        examined += len(ns)
        if not prob.protects_some(ns, c):
            break
        atis = prob.ati(ns, c)
        close = atis <= best_ati * (1 + TIE)
        ok = np.zeros(len(ns), dtype=bool)
        ok[close] = prob.single_feasible(ns[close], c)
        for n, a in zip(ns[ok], atis[ok]):
            n = int(n)
            if (n, c) == best:
                continue
            assert a >= best_ati * (1 - TIE), ("better plan missed", prob.key(), n, c, a, best_ati)
            tied += 1
    return examined, tied


def mp_single_ati(prob, n, c):
    pa = mp_tails(prob.model, n, c, prob.pbar, prob.N)[0]
    return prob.N - pa * (prob.N - n)


def mp_quality_at(pa_at, model, N, target, hi):
    """The quality where the OC falls to ``target``: binomial / Poisson, the
    root of pa_at(p) = target (bisection in double precision on the
    50-digit OC, then mpmath's Anderson-Bjorck solver); hypergeometric, the
    smallest D / N with pa_at(D / N) <= target."""
    t = mpf(target)
    if model == HYP:
        lo, top = -1, N  # pa at D = N is 0 for every plan here
        while top - lo > 1:
            mid = (lo + top) // 2
            if pa_at(mid / N) <= t:
                top = mid
            else:
                lo = mid
        return to_float(mpf(top) / N)
    a, b = 0.0, hi
    assert pa_at(b) < t
    for _ in range(60):
        m = 0.5 * (a + b)
        a, b = (m, b) if pa_at(m) > t else (a, m)
    with mp.workdps(40):
        root = mp.findroot(lambda p: pa_at(p) - t, (mpf(a), mpf(b)), solver="anderson")
    return to_float(root)


def single_row(prob):
    """One ``single`` row."""
    t0 = time.time()
    rows, best, best_ati = single_scan(prob)
    examined, tied = single_box(prob, best, best_ati)
    row = prob.key()
    row["rows"] = [dict(c=c, n_min=n, ati=None if n is None else to_float(mp_single_ati(prob, n, c)))
                   for c, n in rows]
    row.update(box_plans=examined, tied=tied)
    if best is None:
        row.update(full_inspection=True, n=None, c=None, pa=None, ati=float(prob.N), aoql=None,
                   aoql_quality=None, ltpd=None, ltpd_risk=None, pa_at_ltpd=None)
    else:
        n, c = best
        N = prob.N
        pa_at = lambda p: mp_tails(prob.model, n, c, p, N)[0]  # noqa: E731
        aoql, aoql_q = mp_aoql(prob.model, n, c, N)
        risk = prob.beta if prob.kind == "ltpd" else AOQL_PLAN_RISK
        hi = 1.0 - 1e-9 if prob.model == BIN else 20.0 * (c + 2) / n
        row.update(full_inspection=False, n=n, c=c, pa=to_float(pa_at(prob.pbar)),
                   ati=to_float(mp_single_ati(prob, n, c)), aoql=aoql, aoql_quality=aoql_q,
                   ltpd=mp_quality_at(pa_at, prob.model, N, risk, hi), ltpd_risk=risk,
                   pa_at_ltpd=to_float(pa_at(prob.quality)) if prob.kind == "ltpd" else None)
    row["near_ties"] = prob.near
    prob.elapsed = time.time() - t0
    return row


# --------------------------------------------------------------------------
# Double plans: the box
# --------------------------------------------------------------------------


class DoubleBox:
    """Dodge and Romig double plans (n1, c1, r1 = c2 + 1, n2, c2) with
    c2 <= c2_max, n1 below ``top`` (the best single plan's ATI, or N: every
    plan inspects at least n1) and every n2 within the lot."""

    def __init__(self, prob, top, c2_max):
        self.p, self.top, self.c2_max = prob, top, c2_max
        N = prob.N
        self.n1s = np.arange(1, min(N, top))
        self.n2s = np.arange(1, N)

    def grid(self, c2, q):
        """For quality parameter q: pmf1[d, i] = P(d1 = d) at n1s[i] for
        d = 0..c2, and the second stage's cdf2[d, i, j] = P(d2 <= c2 - d)
        at n2s[j] after n1s[i] units that held d (nan where n1 + n2 > N)."""
        P, N = self.p, self.p.N
        d = np.arange(c2 + 1)[:, None]
        pmf1 = pmf(P.model, d, self.n1s[None, :], q, N)
        if P.model != HYP:
            cdf2 = cdf(P.model, (c2 - d), self.n2s[None, :], q, N)  # (d, j)
            cdf2 = np.broadcast_to(cdf2[:, None, :], (c2 + 1, len(self.n1s), len(self.n2s))).copy()
        else:
            cdf2 = np.empty((c2 + 1, len(self.n1s), len(self.n2s)))
            for i, n1 in enumerate(self.n1s):
                left_bad = np.maximum(q - d, 0)
                with np.errstate(invalid="ignore"):
                    cdf2[:, i, :] = cdf(HYP, c2 - d, self.n2s[None, :], left_bad, N - n1)
        over = (self.n1s[:, None] + self.n2s[None, :]) > N
        cdf2[:, over] = np.nan
        return pmf1, cdf2

    @staticmethod
    def accept(pmf1, cdf2, c1, c2):
        """(a1[i], Pa[i, j]) for the plan with c1 (r1 = c2 + 1)."""
        a1 = pmf1[: c1 + 1].sum(axis=0)
        acc2 = np.einsum("di,dij->ij", pmf1[c1 + 1: c2 + 1], cdf2[c1 + 1: c2 + 1])
        return a1, a1[:, None] + acc2

    def saving(self, a1, pa):
        N = self.p.N
        rest = N - (self.n1s[:, None] + self.n2s[None, :]).astype(float)
        return pa * rest + a1[:, None] * self.n2s[None, :]

    def valid(self, c1, c2):
        n1, n2 = self.n1s[:, None], self.n2s[None, :]
        ok = (n1 + n2) <= self.p.N
        if self.p.unit:
            ok &= (n1 > c1) & (n1 + n2 > c2)
        return ok


def plan_stages(n1, c1, n2, c2):
    return [[n1, c1, c2 + 1], [n1 + n2, c2, c2 + 1]]


def double_aoq(prob, stages, q):
    """AOQ of a double plan at quality parameter q, double precision."""
    (n1, c1, r1), (n, c2, _) = stages
    n2, N = n - n1, prob.N
    d = np.arange(c1 + 1, r1)
    a1 = cdf(prob.model, c1, n1, q, N)
    p1 = pmf(prob.model, d, n1, q, N)
    if prob.model == HYP:
        second = cdf(HYP, c2 - d, n2, np.maximum(q - d, 0), N - n1)
    else:
        second = cdf(prob.model, c2 - d, n2, q, N)
    pa = a1 + (p1 * second).sum()
    p = q / N if prob.model == HYP else q
    return p * (pa * (N - n) + a1 * n2) / N


def double_aoql(prob, stages):
    """(AOQL, quality) of a double plan in double precision: every D for
    the hypergeometric model; otherwise a 4000-point geometric grid from
    1e-6 to where the first sample alone is almost surely rejected, with
    every local maximum refined by golden section (the curve may have one
    hump per stage)."""
    N = prob.N
    if prob.model == HYP:
        v = np.array([double_aoq(prob, stages, D) for D in range(N + 1)])
        assert np.isfinite(v).all(), stages
        i = int(np.argmax(v))
        return float(v[i]), i / N
    (n1, c1, _), _ = stages
    hi = 40.0 * (c1 + 2) / n1
    if prob.model == BIN:
        hi = min(hi, 1.0 - 1e-9)
    grid = np.geomspace(1e-6, hi, 4000)
    v = np.array([double_aoq(prob, stages, p) for p in grid])
    assert np.isfinite(v).all() and v[-1] < 1e-3 * v.max(), stages
    best = (float(v.max()), float(grid[int(np.argmax(v))]))
    for i in range(1, len(grid) - 1):
        if v[i] >= v[i - 1] and v[i] >= v[i + 1] and v[i] > 0.5 * best[0]:
            f = lambda p: double_aoq(prob, stages, p)  # noqa: E731
            p = golden_max(f, grid[i - 1], grid[i + 1])
            if f(p) > best[0]:
                best = (float(f(p)), p)
    return best


def mp_double_measures(prob, stages, p):
    """(Pa, ATI, ASN, AOQ) of a double plan at quality p, 50 digits."""
    acc, rej = mp_stage_dp(prob.model, stages, p, prob.N)
    N, P = prob.N, mpf(p)
    pa = mp.fsum(acc)
    ati = mp.fsum(a * s[0] for a, s in zip(acc, stages)) + mp.fsum(rej) * N
    asn = mp.fsum((a + r) * s[0] for a, r, s in zip(acc, rej, stages))
    aoq = mp.fsum(a * P * (N - s[0]) / N for a, s in zip(acc, stages))
    return pa, ati, asn, aoq


def mp_double_aoql(prob, stages, guess):
    """The AOQL at 50 digits around the double-precision maximiser
    ``guess``: the neighbouring D (hypergeometric), or golden section on the
    50-digit AOQ within 1% of it."""
    N = prob.N
    f = lambda p: mp_double_measures(prob, stages, p)[3]  # noqa: E731
    if prob.model == HYP:
        D0 = round(guess * N)
        vals = [(f(D / N), D) for D in range(max(D0 - 3, 0), min(D0 + 3, N) + 1)]
        v, D = max(vals)
        return to_float(v), to_float(mpf(D) / N)
    m = golden_max(f, mpf(guess) * mpf("0.99"), mpf(guess) * mpf("1.01"), mpf(10) ** -20)
    return to_float(f(m)), to_float(m)


def double_decides(prob, stages):
    """Whether a double plan gives the protection (near ties at 50 digits)."""
    if prob.kind == "ltpd":
        q_t = quality_param(prob.model, prob.quality, prob.N)
        (n1, c1, _), (n, c2, _) = stages
        d = np.arange(c1 + 1, c2 + 1)
        a1 = cdf(prob.model, c1, n1, q_t, prob.N)
        p1 = pmf(prob.model, d, n1, q_t, prob.N)
        if prob.model == HYP:
            second = cdf(HYP, c2 - d, n - n1, np.maximum(q_t - d, 0), prob.N - n1)
        else:
            second = cdf(prob.model, c2 - d, n - n1, q_t, prob.N)
        pa = float(a1 + (p1 * second).sum())
        if abs(pa - prob.beta) <= MARGIN * prob.beta:
            prob.near.append(dict(what="ltpd", stages=stages))
            return mp_double_measures(prob, stages, prob.quality)[0] <= mpf(prob.beta)
        return pa <= prob.beta
    value, q = double_aoql(prob, stages)
    if abs(value - prob.quality) <= MARGIN * prob.quality:
        prob.near.append(dict(what="aoql", stages=stages))
        value = mp_double_aoql(prob, stages, q)[0]
    return value <= prob.quality


def double_search(prob, top, c2_max):
    """The double plan with the smallest ATI(p̄) in the box, or None when
    none is below ``top``.  For each (c1, c2) every plan's ATI comes from
    one vectorised evaluation; plans that cannot beat the best so far are
    dropped, an LTPD is decided for all at once, and for an AOQL the plans
    left are refuted by the AOQ at 40 qualities where possible and the rest
    decided one by one in order of ATI."""
    box = DoubleBox(prob, top, c2_max)
    best, best_key, examined = None, None, 0
    best_ati = float(top)
    N = prob.N
    if prob.kind == "aoql":
        if prob.model == HYP:
            lower_q = np.unique(np.clip(np.round(np.geomspace(prob.quality / 2, min(0.9, 30 * prob.quality), 40) * N), 1, N))
        else:
            lower_q = np.geomspace(prob.quality / 2, min(0.9, 30 * prob.quality), 40)
    for c2 in range(1, c2_max + 1):
        pmf_bar, cdf_bar = box.grid(c2, prob.q_bar)
        if prob.kind == "ltpd":
            pmf_t, cdf_t = box.grid(c2, quality_param(prob.model, prob.quality, N))
        else:
            lower_grids = [box.grid(c2, q) for q in lower_q]
        for c1 in range(c2):
            valid = box.valid(c1, c2)
            a1, pa = box.accept(pmf_bar, cdf_bar, c1, c2)
            ati = N - box.saving(a1, pa)
            cand = valid & (ati < best_ati * (1 + TIE))
            examined += int(valid.sum())
            if not cand.any():
                continue
            if prob.kind == "ltpd":
                _, pa_t = box.accept(pmf_t, cdf_t, c1, c2)
                near = cand & (np.abs(pa_t - prob.beta) <= MARGIN * prob.beta)
                cand &= (pa_t <= prob.beta) | near
            else:
                lower = np.zeros_like(ati)
                for q, (pm, cd) in zip(lower_q, lower_grids):
                    a1q, paq = box.accept(pm, cd, c1, c2)
                    p = q / N if prob.model == HYP else q
                    lower = np.maximum(lower, np.nan_to_num(p * box.saving(a1q, paq) / N))
                cand &= lower <= prob.quality
            order = sorted(zip(ati[cand], *np.nonzero(cand)))
            for a, i, j in order:
                if a > best_ati * (1 + TIE):
                    break
                n1, n2 = int(box.n1s[i]), int(box.n2s[j])
                stages = plan_stages(n1, c1, n2, c2)
                # an LTPD was decided for the whole block above, except
                # within MARGIN of beta
                undecided = prob.kind == "aoql" or abs(pa_t[i, j] - prob.beta) <= MARGIN * prob.beta
                if undecided and not double_decides(prob, stages):
                    continue
                key = (n1 + n2, c2, c1, c2 + 1, n1)
                if best is None or a < best_ati * (1 - TIE):
                    best, best_key, best_ati = stages, key, float(a)
                elif key < best_key:
                    best, best_key = stages, key
    return best, examined


def double_row(prob, c2_max):
    """One ``double`` row: the best single plan (from the exhaustive single
    search) bounds n1; the box covers c2 <= c2_max."""
    t0 = time.time()
    rows, single, single_ati = single_scan(prob)
    best, examined = double_search(prob, single_ati, c2_max)
    row = prob.key()
    single_c = single[1] if single else rows[-1][0]
    row.update(single_n=single[0] if single else None, single_c=single[1] if single else None,
               single_ati=to_float(mp_single_ati(prob, *single)) if single else float(prob.N),
               c2_box=c2_max, box_plans=examined, start_c=single_c)
    if best is None:
        row.update(stages=None, pa=None, ati=None, asn=None, aoql=None, aoql_quality=None,
                   ltpd=None, ltpd_risk=None, pa_at_ltpd=None)
    else:
        pa, ati, asn, _ = mp_double_measures(prob, best, prob.pbar)
        _, guess = double_aoql(prob, best)
        aoql, aoql_q = mp_double_aoql(prob, best, guess)
        risk = prob.beta if prob.kind == "ltpd" else AOQL_PLAN_RISK
        pa_at = lambda p: mp_double_measures(prob, best, p)[0]  # noqa: E731
        hi = 1.0 - 1e-9 if prob.model == BIN else 40.0 * (best[0][1] + 2) / best[0][0]
        row.update(stages=best, pa=to_float(pa), ati=to_float(ati), asn=to_float(asn),
                   aoql=aoql, aoql_quality=aoql_q, ltpd_risk=risk,
                   ltpd=mp_quality_at(pa_at, prob.model, prob.N, risk, hi),
                   pa_at_ltpd=to_float(pa_at(prob.quality)) if prob.kind == "ltpd" else None)
    row["near_ties"] = prob.near
    prob.elapsed = time.time() - t0
    return row


# --------------------------------------------------------------------------
# Cases
# --------------------------------------------------------------------------

#: (model, N, p̄, protection, quality, beta)
SINGLE_CASES = [
    (HYP, 50, 0.01, "ltpd", 0.10, 0.10),
    (HYP, 50, 0.02, "ltpd", 0.05, 0.10),
    (HYP, 120, 0.005, "ltpd", 0.05, 0.10),
    (HYP, 200, 0.01, "ltpd", 0.05, 0.05),
    (HYP, 500, 0.005, "ltpd", 0.03, 0.10),
    (HYP, 1000, 0.01, "ltpd", 0.04, 0.10),
    (HYP, 1000, 0.002, "ltpd", 0.01, 0.10),
    (HYP, 5000, 0.0025, "ltpd", 0.01, 0.10),  # a published table's conditions
    (HYP, 12, 0.25, "ltpd", 0.30, 0.10),  # D = 3 and 4 in a lot of 12
    (BIN, 300, 0.01, "ltpd", 0.05, 0.10),
    (BIN, 5000, 0.0025, "ltpd", 0.01, 0.10),
    (BIN, 50, 0.005, "ltpd", 0.02, 0.10),  # no sample within the lot protects
    (POI, 400, 0.01, "ltpd", 0.05, 0.10),
    (HYP, 100, 0.01, "aoql", 0.03, None),
    (HYP, 300, 0.015, "aoql", 0.03, None),
    (HYP, 1000, 0.005, "aoql", 0.01, None),
    (HYP, 5000, 0.01, "aoql", 0.03, None),  # a published table's conditions
    (BIN, 500, 0.01, "aoql", 0.025, None),
    (BIN, 5000, 0.01, "aoql", 0.03, None),
    (POI, 800, 0.005, "aoql", 0.02, None),
]

#: (model, N, p̄, protection, quality, beta, c2_max)
DOUBLE_CASES = [
    (BIN, 400, 0.01, "ltpd", 0.06, 0.10, 12),
    (HYP, 500, 0.005, "ltpd", 0.05, 0.10, 10),
    (HYP, 1000, 0.01, "ltpd", 0.05, 0.10, 14),
    (POI, 300, 0.01, "ltpd", 0.08, 0.10, 10),
    (BIN, 1000, 0.01, "aoql", 0.02, None, 10),
    (HYP, 200, 0.01, "aoql", 0.04, None, 8),
    (BIN, 300, 0.02, "aoql", 0.05, None, 10),
    (BIN, 50, 0.005, "ltpd", 0.02, 0.10, 4),  # no plan within the lot protects
]


def build_fixture(timings):
    single = []
    for case in SINGLE_CASES:
        prob = Problem(*case)
        single.append(single_row(prob))
        timings.append(("single", case, prob.elapsed))
        if VERBOSE:
            print(f"note: {prob.elapsed:6.2f} s single {case}", flush=True)
    double = []
    for *case, c2_max in DOUBLE_CASES:
        prob = Problem(*case)
        double.append(double_row(prob, c2_max))
        timings.append(("double", tuple(case), prob.elapsed))
        if VERBOSE:
            print(f"note: {prob.elapsed:6.2f} s double {tuple(case)}", flush=True)
    return {"single": single, "double": double}


# --------------------------------------------------------------------------
# Self-test: the shortcuts against plain loops
# --------------------------------------------------------------------------


def self_test():
    """Plain loops over small cases, without vectors or bounds: every (n, c)
    with its exact AOQL or Pa; every double plan of a small box one by one."""
    for case in [(HYP, 40, 0.025, "aoql", 0.05, None), (BIN, 60, 0.01, "ltpd", 0.08, 0.10),
                 (POI, 50, 0.02, "aoql", 0.06, None), (HYP, 30, 0.04, "ltpd", 0.15, 0.10)]:
        prob = Problem(*case)
        rows, best, best_ati = single_scan(prob)
        naive, naive_ati = None, float(prob.N)
        for n in range(1, prob.N + 1):
            for c in range(0, (n if prob.unit else 3 * n + 10)):
                if prob.kind == "ltpd":
                    ok = float(cdf(prob.model, c, n, quality_param(prob.model, prob.quality, prob.N), prob.N)) <= prob.beta
                else:
                    ok = prob.aoql_single(n, c)[0] <= prob.quality
                if not ok:
                    continue
                a = float(prob.ati(n, c))
                if a < naive_ati * (1 - TIE) or (a <= naive_ati * (1 + TIE) and naive and (n, c) < naive):
                    naive, naive_ati = (n, c), min(a, naive_ati)
        assert naive == best, (case, naive, best)
        for c, n in rows:
            plain = next((m for m in range(prob.smallest_n(c), prob.N + 1)
                          if (prob.aoql_single(m, c)[0] <= prob.quality if prob.kind == "aoql"
                              else float(cdf(prob.model, c, m, quality_param(prob.model, prob.quality, prob.N), prob.N)) <= prob.beta)),
                         None)
            assert plain == n, (case, c, plain, n)
        print("single ok", case, best)
    for case, c2_max in [((BIN, 60, 0.01, "ltpd", 0.10, 0.10), 4), ((HYP, 40, 0.02, "aoql", 0.06, None), 4)]:
        prob = Problem(*case)
        _, single, single_ati = single_scan(prob)
        best, _ = double_search(prob, single_ati, c2_max)
        naive, naive_ati, naive_key = None, single_ati, None
        for c2 in range(1, c2_max + 1):
            for c1 in range(c2):
                for n1 in range(c1 + 1 if prob.unit else 1, prob.N):
                    for n2 in range(max(1, c2 + 1 - n1) if prob.unit else 1, prob.N - n1 + 1):
                        stages = plan_stages(n1, c1, n2, c2)
                        a = float(mp_double_measures(prob, stages, prob.pbar)[1])
                        if a >= naive_ati * (1 + TIE) or not double_decides(prob, stages):
                            continue
                        key = (n1 + n2, c2, c1, c2 + 1, n1)
                        if naive is None or a < naive_ati * (1 - TIE):
                            naive, naive_key, naive_ati = stages, key, a
                        elif key < naive_key:
                            naive, naive_key = stages, key
        assert naive == best, (case, naive, best)
        print("double ok", case, best)


def bench():
    """Timings of the exhaustive searches, one line per case."""
    timings = []
    build_fixture(timings)
    for kind, case, seconds in timings:
        print(f"{seconds:8.2f} s  {kind} {case}")


def main(argv=None):
    args = parse_args(argv, __doc__)
    if args.bench:
        bench()
        return 0
    if args.self_test:
        self_test()
        return 0
    global VERBOSE
    VERBOSE = args.verbose
    t0 = time.time()
    timings = []
    text = render(build_fixture(timings))
    if args.verbose:
        print(f"built in {time.time() - t0:.1f} s with scipy {scipy.__version__}, "
              f"numpy {np.__version__}, mpmath {mpmath.__version__}")
    return write_or_check(FIXTURE, text, "make_minimum_reference.py", args.check)


if __name__ == "__main__":
    sys.exit(main())
