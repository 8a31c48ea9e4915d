#!/usr/bin/env python3
"""Independent reference values for lotsman's staged (double, multiple and
item-by-item) plans.

Writes ``tests/data/staged_reference.json`` from first principles, using only
general-purpose numerical libraries: mpmath at 50 significant digits for
every stored probability, scipy.stats / scipy.special / numpy in double
precision for the exhaustive design searches (whose winners are re-checked
at 50 digits).  Nothing here comes from any acceptance-sampling package.
The 50-digit tails, ``lot_defectives``, the single-plan designer and
``render`` are imported from ``make_reference.py`` in this directory.

Usage (from the repository root)::

    python3 tests/reference/make_staged_reference.py             # (re)write the fixture
    python3 tests/reference/make_staged_reference.py --check     # exit 1 if it would change
    python3 tests/reference/make_staged_reference.py --bench     # print timings, write nothing
    python3 tests/reference/make_staged_reference.py --self-test # brute-force cross-checks

Conventions (mirrored by the Rust code):

* a staged plan is a list of stages ``[n_j, a_j, r_j]`` on cumulative sample
  sizes and cumulative counts: after ``n_j`` units accept when ``d <= a_j``
  (``a_j = None``: the stage cannot accept), reject when ``d >= r_j``, go on
  otherwise; the last stage has ``r = a + 1``;
* binomial: each unit nonconforming with probability p; Poisson: each unit
  carries Poisson(p) nonconformities, a stage of m units Poisson(m p);
  hypergeometric: lot N with ``D = lot_defectives(p, N)`` nonconforming
  units, drawn without replacement, each stage from what the earlier
  stages left;
* ``acc_j`` / ``rej_j``: probability of accepting / rejecting at stage j;
  ``Pa = sum acc_j``; ``ASN = sum (acc_j + rej_j) n_j``; with a lot size
  ``AOQ = sum acc_j p (N - n_j) / N`` and ``ATI = sum acc_j n_j + (1 - Pa) N``
  (``1 - Pa`` taken as ``sum rej_j``), without one ``AOQ = Pa p``, ATI null;
* producer's risk = ``sum rej_j`` at p1 (never ``1 - Pa``), consumer's risk
  = ``Pa`` at p2; a plan "meets the points" when producer's risk <= alpha
  and consumer's risk <= beta, compared at 50 digits with alpha and beta
  taken as the exact binary64 values.

The output is deterministic: keys sorted, floats written with ``repr``, no
timestamps or versions in the data.
"""

from __future__ import annotations

import itertools
import math
import statistics
import sys
import time
from collections import defaultdict
from fractions import Fraction
from pathlib import Path

import mpmath
import numpy as np
import scipy
import scipy.special as sps
import scipy.stats as st
from mpmath import mp, mpf

sys.path.insert(0, str(Path(__file__).resolve().parent))
import make_reference as ref  # noqa: E402  (sets mp.dps = 50)
from make_reference import (  # noqa: E402
    BIN, HYP, POI, DesignProblem, lot_defectives, mp_binom_tails, mp_hyper_tails,
    mp_poisson_tails, render, to_float,
)

REPO = Path(__file__).resolve().parents[2]
FIXTURE = REPO / "tests" / "data" / "staged_reference.json"

#: Relative width within which two criterion values count as tied.
TIE = 1e-12
#: Relative distance from a threshold inside which a double-precision
#: feasibility decision is re-taken at 50 digits.
MARGIN = 1e-9

assert mp.dps == ref.MP_DPS == 50


# --------------------------------------------------------------------------
# Plans
# --------------------------------------------------------------------------


def check_plan(model, stages, lot_size=None):
    """Assert that ``stages`` is a valid staged plan (the Rust rules).

    Cumulative sizes strictly increasing from 1; ``a < r`` and ``r >= 1`` on
    every stage; every stage but the last leaves a count undecided
    (``a + 2 <= r``, or ``r >= 1`` when it cannot accept); the last stage has
    ``r = a + 1``; unit-count models: ``a < n``; hypergeometric: ``n <= N``.
    """
    prev = 0
    for j, (n, a, r) in enumerate(stages):
        last = j == len(stages) - 1
        assert n > prev and r >= 1, stages
        if a is not None:
            assert 0 <= a < r, stages
            assert model == POI or a < n, stages
        if last:
            assert a is not None and r == a + 1, stages
        else:
            assert (0 if a is None else a + 1) + 1 <= r, stages
        prev = n
    if model == HYP:
        assert prev <= lot_size, stages


def _accept_cut(a):
    """Acceptance number as an int; -1 for a stage that cannot accept."""
    return -1 if a is None else a


# --------------------------------------------------------------------------
# 50-digit stage counts
# --------------------------------------------------------------------------


class MpIncrement:
    """Distribution of the count in a stage's m new units, at 50 digits.

    Binomial(m, p); Poisson(m p) with lambda formed exactly from the binary64
    p; hypergeometric from the ``left`` units and ``bad`` nonconforming ones
    the earlier stages left.  ``pmf`` is exact up to rounding: integer
    binomial coefficients times powers (binomial, hypergeometric as a ratio
    of exact integers), ``exp(-lambda) lambda^x / x!`` (Poisson);
    ``upper(t) = P(X >= t)`` is a directly summed upper tail from
    make_reference (never 1 - cdf).
    """

    def __init__(self, model, m, p, left=None, bad=None):
        self.model, self.m, self.left, self.bad = model, m, left, bad
        self.p = mpf(p)
        self.lam = mpf(m) * self.p
        self._pmf = {}

    def pmf(self, x):
        if x not in self._pmf:
            m = self.m
            if x < 0 or (self.model != POI and x > m):
                v = mpf(0)
            elif self.model == BIN:
                v = math.comb(m, x) * self.p ** x * (1 - self.p) ** (m - x)
            elif self.model == POI:
                v = mp.exp(-self.lam) * self.lam ** x / mp.factorial(x)
            else:
                num = math.comb(self.bad, x) * math.comb(self.left - self.bad, m - x)
                v = mpf(num) / math.comb(self.left, m)
            self._pmf[x] = v
        return self._pmf[x]

    def upper(self, t):
        """P(X >= t)."""
        if t <= 0:
            return mpf(1)
        if self.model == BIN:
            return mp_binom_tails(self.m, t - 1, self.p)[1]
        if self.model == POI:
            return mp_poisson_tails(self.lam, t - 1)[1]
        return mp_hyper_tails(self.left, self.bad, self.m, t - 1)[1]


def mp_stage_dp(model, stages, p, lot_size=None):
    """Stage-level recursion for the decision probabilities, 50 digits.

    With ``w_j(d)`` the probability of being undecided with cumulative count
    d before stage j (``w_1(0) = 1``) and ``X_j`` the stage count::

        acc_j = sum_d w_j(d) P(X_j <= a_j - d)
        rej_j = sum_d w_j(d) P(X_j >= r_j - d)      (a directly summed tail)
        w_{j+1}(d') = sum_d w_j(d) P(X_j = d' - d),  a_j < d' < r_j

    Hypergeometric: ``X_j | d ~ HG(N - n_{j-1}, D - d, n_j - n_{j-1})``.
    Returns ``(acc, rej)`` as lists of mpf.
    """
    D = lot_defectives(p, lot_size) if model == HYP else None
    cont, prev, acc, rej = {0: mpf(1)}, 0, [], []
    shared = None
    for n, a, r in stages:
        m, aa = n - prev, _accept_cut(a)
        if model != HYP:
            shared = MpIncrement(model, m, p)
        new, rj = defaultdict(mpf), mpf(0)
        for d, w in cont.items():
            inc = shared or MpIncrement(model, m, p, lot_size - prev, D - d)
            for x in range(max(r - d, 0)):
                new[d + x] += w * inc.pmf(x)
            rj += w * inc.upper(r - d)
        acc.append(mp.fsum(v for d, v in new.items() if d <= aa))
        rej.append(rj)
        cont = {d: v for d, v in new.items() if aa < d < r and v != 0}
        prev = n
    assert not cont
    return acc, rej


def _mp_unit_step(model, dist, p, drawn, D, N, limit, pois=None):
    """One more unit on the undecided lots ``dist`` (count -> probability).

    Binomial: count +1 with probability p.  Hypergeometric: +1 with
    probability (D - d) / (N - drawn).  Poisson: + x with probability
    pois(x; p).  Counts >= ``limit`` are lumped into the returned tail mass
    (they are decided by then).  Returns ``(new_dist, tail)``.
    """
    new, tail = defaultdict(mpf), mpf(0)
    if model == POI:
        pmf, upper = pois
        for d, w in dist.items():
            for x in range(max(limit - d, 0)):
                new[d + x] += w * pmf(x)
            tail += w * upper(limit - d)
    else:
        for d, w in dist.items():
            if model == BIN:
                q_bad = p
            else:
                q_bad = mpf(D - d) / (N - drawn)
            for d2, v in ((d, w * (1 - q_bad)), (d + 1, w * q_bad)):
                if v == 0:
                    continue
                if d2 >= limit:
                    tail += v
                else:
                    new[d2] += v
    return {d: v for d, v in new.items() if v != 0}, tail


def _mp_poisson_unit(p):
    """(pmf, upper) of one unit's Poisson(p) count, memoised."""
    inc = MpIncrement(POI, 1, p)
    cache = {}

    def upper(t):
        if t not in cache:
            cache[t] = inc.upper(t)
        return cache[t]
    return inc.pmf, upper


def mp_item_dp(model, stages, p, lot_size=None):
    """Item-level dynamic programme over (units inspected, cumulative count).

    Units are inspected one at a time, at 50 digits.  Within stage j, after
    each unit (and on entering the stage, before its first unit):

    * reject as soon as the cumulative count reaches ``r_j``;
    * binomial / hypergeometric: accept as soon as
      ``d + (units left in the stage) <= a_j``;
    * Poisson (a unit may carry several nonconformities, counts added after
      each whole unit): only the rejection rule applies early; at the end of
      the stage accept when ``d <= a_j``.

    Curtailment never changes the decision or its stage, so the same pass
    also gives ``acc_j`` and ``rej_j`` by a method independent of
    :func:`mp_stage_dp`.  Returns ``(acc, rej, curtailed_asn)``.
    """
    P = mpf(p)
    D = lot_defectives(p, lot_size) if model == HYP else None
    pois = _mp_poisson_unit(p) if model == POI else None
    k = len(stages)
    acc, rej = [mpf(0)] * k, [mpf(0)] * k
    units = mpf(0)
    dist, i = {0: mpf(1)}, 0
    for j, (n, a, r) in enumerate(stages):
        aa = _accept_cut(a)

        def settle(dist, tail):
            nonlocal units
            rej[j] += tail
            units += tail * i
            keep = {}
            for d, w in dist.items():
                if d >= r:
                    rej[j] += w
                    units += w * i
                elif (model != POI or i == n) and d + (n - i) <= aa:
                    acc[j] += w
                    units += w * i
                else:
                    keep[d] = w
            return keep

        dist = settle(dist, mpf(0))
        while i < n:
            dist, tail = _mp_unit_step(model, dist, P, i, D, lot_size, r, pois)
            i += 1
            dist = settle(dist, tail)
    assert not dist
    return acc, rej, units


def measures_from(acc, rej, stages, p, lot_size):
    """Pa, ASN, AOQ and ATI from the stage decision probabilities (mpf)."""
    pa = mp.fsum(acc)
    asn = mp.fsum((x + y) * s[0] for x, y, s in zip(acc, rej, stages))
    P = mpf(p)
    if lot_size is None:
        return pa, asn, pa * P, None
    N = lot_size
    aoq = mp.fsum(x * P * (N - s[0]) / N for x, s in zip(acc, stages))
    ati = mp.fsum(x * s[0] for x, s in zip(acc, stages)) + mp.fsum(rej) * N
    return pa, asn, aoq, ati


def _agree(a, b, tol=mpf(10) ** -40):
    """Relative agreement of two mpf values (absolute below 1e-300)."""
    return abs(a - b) <= tol * max(abs(a), abs(b), mpf(10) ** -300)


def staged_measures_row(model, stages, p, lot_size=None):
    """One ``staged_measures`` row: stage DP, cross-checked by the item DP."""
    check_plan(model, stages, lot_size)
    acc, rej = mp_stage_dp(model, stages, p, lot_size)
    acc2, rej2, asn_c = mp_item_dp(model, stages, p, lot_size)
    for x, y in zip(acc + rej, acc2 + rej2):
        assert _agree(x, y), (model, stages, p, x, y)
    assert abs(mp.fsum(acc + rej) - 1) < mpf(10) ** -45
    pa, asn, aoq, ati = measures_from(acc, rej, stages, p, lot_size)
    return dict(model=model, lot_size=lot_size, stages=[list(s) for s in stages], p=p,
                pa=to_float(pa), asn=to_float(asn), asn_curtailed=to_float(asn_c),
                aoq=to_float(aoq), ati=None if ati is None else to_float(ati),
                accept=[to_float(x) for x in acc], reject=[to_float(x) for x in rej])


def mp_risks(model, stages, p1, p2, lot_size=None):
    """(producer's risk = sum rej_j at p1, consumer's risk = Pa at p2, acc, rej at p1)."""
    acc1, rej1 = mp_stage_dp(model, stages, p1, lot_size)
    acc2, _ = mp_stage_dp(model, stages, p2, lot_size)
    return mp.fsum(rej1), mp.fsum(acc2), acc1, rej1


# --------------------------------------------------------------------------
# Sequential (Wald SPRT) plans
# --------------------------------------------------------------------------


def wald_lines(model, p1, alpha, p2, beta):
    """Wald's SPRT lines in binary64, in the exact order of operations.

    Binomial (and hypergeometric): g1 = ln(p2/p1), g2 = ln((1-p1)/(1-p2)),
    G = g1 + g2, slope = g2/G.  Poisson: G = ln(p2/p1), slope = (p2-p1)/G.
    Both: h_accept = ln((1-alpha)/beta)/G, h_reject = ln((1-beta)/alpha)/G.
    """
    if model == POI:
        G = math.log(p2 / p1)
        slope = (p2 - p1) / G
    else:
        g1 = math.log(p2 / p1)
        g2 = math.log((1 - p1) / (1 - p2))
        G = g1 + g2
        slope = g2 / G
    h_accept = math.log((1 - alpha) / beta) / G
    h_reject = math.log((1 - beta) / alpha) / G
    return h_accept, h_reject, slope


def line_numbers(h_accept, h_reject, slope, n):
    """(a(n), r(n)) = (floor(slope n - h_accept) or None if < 0, ceil(slope n + h_reject))."""
    a = math.floor(slope * n - h_accept)
    return (a if a >= 0 else None), math.ceil(slope * n + h_reject)


def sequential_stages(lines, n_t, a_t):
    """The item-by-item plan truncated at n_t with final acceptance number a_t."""
    return [[i, *line_numbers(*lines, i)] for i in range(1, n_t)] + [[n_t, a_t, a_t + 1]]


class ItemWalk:
    """Undecided lots of one quality under an item-by-item plan, 50 digits."""

    def __init__(self, model, p, lot_size):
        self.model, self.p, self.N = model, mpf(p), lot_size
        self.D = lot_defectives(p, lot_size) if model == HYP else None
        self.pois = _mp_poisson_unit(p) if model == POI else None
        self.dist, self.drawn = {0: mpf(1)}, 0
        self.acc, self.rej = mpf(0), mpf(0)

    def peek(self, limit):
        """Counts after one more unit: (dist of counts < limit, mass >= limit)."""
        return _mp_unit_step(self.model, self.dist, self.p, self.drawn, self.D, self.N,
                             limit, self.pois)

    def commit(self, peeked, a, r):
        """Apply the line decisions (accept d <= a, reject d >= r) to ``peeked``."""
        new, tail = peeked
        aa = _accept_cut(a)
        self.acc += mp.fsum(w for d, w in new.items() if d <= aa)
        self.rej += tail + mp.fsum(w for d, w in new.items() if d >= r)
        self.dist = {d: w for d, w in new.items() if aa < d < r}
        self.drawn += 1


def truncation_search(model, lines, p1, alpha, p2, beta, lot_size, n_cap):
    """Smallest truncation n_t of the SPRT that meets both points exactly.

    Exact item-level recursion at 50 digits for both qualities.  At each n
    the plan is closed with every a_t in [max(a(n), 0), r(n) - 1] (and
    a_t < n for the unit-count models): producer's risk = rejections before
    n + P(undecided and d_n >= a_t + 1) at p1, consumer's risk = acceptances
    before n + P(undecided and d_n <= a_t) at p2.  Among the a_t meeting
    both points: smallest max(risk1/alpha, risk2/beta), then smallest a_t.

    Rejections before n at p1 and acceptances before n at p2 only grow with
    n and bound the risks of every later truncation from below, so once
    either exceeds its limit no truncation can meet the points (returns
    None with reason "never_meets").  Returns (n_t, a_t, risk1, risk2, reason).
    """
    A, B = mpf(alpha), mpf(beta)
    w1, w2 = ItemWalk(model, p1, lot_size), ItemWalk(model, p2, lot_size)
    for n in range(1, n_cap + 1):
        a_n, r_n = line_numbers(*lines, n)
        pk1, pk2 = w1.peek(r_n), w2.peek(r_n)
        best = None
        top = r_n - 1 if model == POI else min(r_n - 1, n - 1)
        for a_t in range(max(_accept_cut(a_n), 0), top + 1):
            pr = w1.rej + pk1[1] + mp.fsum(w for d, w in pk1[0].items() if d > a_t)
            cr = w2.acc + mp.fsum(w for d, w in pk2[0].items() if d <= a_t)
            if pr <= A and cr <= B:
                key = (max(pr / A, cr / B), a_t)
                if best is None or key < best[0]:
                    best = (key, a_t, pr, cr)
        if best is not None:
            return n, best[1], best[2], best[3], None
        w1.commit(pk1, a_n, r_n)
        w2.commit(pk2, a_n, r_n)
        if w1.rej > A or w2.acc > B:
            return None, None, None, None, "never_meets"
    return None, None, None, None, "cap"


def wald_approximations(model, p1, alpha, p2, beta, q1, q2):
    """Wald's ASN approximations at 50 digits from the binary64 inputs.

    A = (1-beta)/alpha, B = beta/(1-alpha);
    ASN(p1) ~ ((1-alpha) ln B + alpha ln A) / E(p1),
    ASN(p2) ~ (beta ln B + (1-beta) ln A) / E(p2), with E(p) the expected
    log-likelihood ratio of one unit: p ln(p2/p1) + (1-p) ln((1-p2)/(1-p1))
    (binomial) or p ln(p2/p1) - (p2 - p1) (Poisson); q1, q2 are the
    qualities the lines use (the lot qualities D/N for hypergeometric).
    ASN max ~ h_accept h_reject / (s (1 - s)) (binomial) or
    h_accept h_reject / s (Poisson), with the exact (50-digit) h's and s.
    """
    a, b, p1, p2 = mpf(alpha), mpf(beta), mpf(q1), mpf(q2)
    lnA, lnB = mp.log((1 - b) / a), mp.log(b / (1 - a))
    if model == POI:
        G = mp.log(p2 / p1)
        slope = (p2 - p1) / G

        def E(p):
            return p * mp.log(p2 / p1) - (p2 - p1)
    else:
        G = mp.log(p2 / p1) + mp.log((1 - p1) / (1 - p2))
        slope = mp.log((1 - p1) / (1 - p2)) / G

        def E(p):
            return p * mp.log(p2 / p1) + (1 - p) * mp.log((1 - p2) / (1 - p1))
    ha, hr = mp.log((1 - a) / b) / G, mp.log((1 - b) / a) / G
    var = slope if model == POI else slope * (1 - slope)
    return dict(wald_asn_p1=to_float(((1 - a) * lnB + a * lnA) / E(p1)),
                wald_asn_p2=to_float((b * lnB + (1 - b) * lnA) / E(p2)),
                wald_asn_max=to_float(ha * hr / var))


def sequential_row(model, p1, alpha, p2, beta, lot_size=None):
    """One ``sequential`` row: lines, exact truncation, OC/ASN, Wald's values."""
    if model == HYP:
        # The lines use the lot qualities D/N; the cases are chosen so that
        # they equal p1 and p2 exactly (no ambiguity about which is meant).
        q1 = lot_defectives(p1, lot_size) / lot_size
        q2 = lot_defectives(p2, lot_size) / lot_size
        assert (q1, q2) == (p1, p2)
    else:
        q1, q2 = p1, p2
    lines = wald_lines(model, q1, alpha, q2, beta)
    single = DesignProblem(model, p1, alpha, p2, beta, lot_size).solve()
    n_cap = lot_size if model == HYP else 100 * single["n"]
    n_t, a_t, pr, cr, reason = truncation_search(model, lines, p1, alpha, p2, beta,
                                                 lot_size, n_cap)
    row = dict(model=model, lot_size=lot_size, p1=p1, alpha=alpha, p2=p2, beta=beta,
               h_accept=lines[0], h_reject=lines[1], slope=lines[2],
               truncation=n_t, final_acceptance=a_t, reason=reason,
               producer_risk=None if pr is None else to_float(pr),
               consumer_risk=None if cr is None else to_float(cr),
               n_single=single["n"], c_single=single["c"],
               **wald_approximations(model, p1, alpha, p2, beta, q1, q2))
    points = []
    if n_t is not None:
        assert n_t >= single["n"], (model, p1, p2, n_t, single["n"])
        stages = sequential_stages(lines, n_t, a_t)
        check_plan(model, stages, lot_size)
        for p in (p1 / 2, p1, lines[2], p2, 1.5 * p2):
            acc, rej, _ = mp_item_dp(model, stages, p, lot_size)
            pa, asn, _, _ = measures_from(acc, rej, stages, p, lot_size)
            points.append(dict(p=p, pa=to_float(pa), asn=to_float(asn),
                               defectives=lot_defectives(p, lot_size) if model == HYP
                               else None))
    row["points"] = points
    return row


# --------------------------------------------------------------------------
# Double-precision tables for the design searches
# --------------------------------------------------------------------------


def _ln_comb(a, b):
    """log C(a, b) elementwise (gammaln); -inf where not 0 <= b <= a."""
    a, b = np.broadcast_arrays(np.asarray(a, float), np.asarray(b, float))
    ok = (b >= 0) & (b <= a)
    aa, bb = np.where(ok, a, 0.0), np.where(ok, b, 0.0)
    v = sps.gammaln(aa + 1) - sps.gammaln(bb + 1) - sps.gammaln(aa - bb + 1)
    return np.where(ok, v, -np.inf)


def hyper_pmf(k, lot, bad, n):
    """Hypergeometric pmf C(bad,k) C(lot-bad,n-k) / C(lot,n), elementwise.

    Double precision via log-gamma (about 3e-12 relative for lots of 1000,
    enough to screen feasibility with the MARGIN re-checks); zero for
    impossible arguments (including bad < 0, a state no draw can reach).
    """
    k, lot, bad, n = np.broadcast_arrays(*(np.asarray(x, float) for x in (k, lot, bad, n)))
    ok = (bad >= 0) & (bad <= lot) & (n <= lot)
    lp = _ln_comb(bad, k) + _ln_comb(lot - bad, n - k) - _ln_comb(np.where(ok, lot, 0),
                                                                   np.where(ok, n, 0))
    return np.where(ok & np.isfinite(lp), np.exp(np.where(np.isfinite(lp), lp, 0.0)), 0.0)


def _upper_sums(f, axis):
    """S[k] = sum_{j > k} f[j] along ``axis``, summed from the top."""
    f = np.moveaxis(f, axis, -1)
    rev = np.cumsum(f[..., ::-1], axis=-1)[..., ::-1]
    S = np.concatenate([rev[..., 1:], np.zeros(f.shape[:-1] + (1,))], axis=-1)
    return np.moveaxis(S, -1, axis)


def hyper_pmf_exact(ks, lot, bad, n):
    """Hypergeometric pmf at the integers ``ks`` from exact integer binomial
    coefficients (one correctly rounded division each)."""
    tot = math.comb(lot, n)
    return np.array([math.comb(bad, k) * math.comb(lot - bad, n - k) / tot
                     if 0 <= k <= bad and 0 <= n - k <= lot - bad else 0.0 for k in ks])


def count_pmf(model, k, n, q):
    """pmf of the count in n units, scipy.stats (binomial, Poisson(n q))."""
    if model == BIN:
        return st.binom.pmf(k, n, q)
    return st.poisson.pmf(k, np.asarray(n) * q)


def count_cdf_sf(model, k, n, q):
    """(P(X <= k), P(X > k)), each computed directly by scipy.stats."""
    if model == BIN:
        return st.binom.cdf(k, n, q), st.binom.sf(k, n, q)
    lam = np.asarray(n) * q
    return st.poisson.cdf(k, lam), st.poisson.sf(k, lam)


def _plain_pmf(model, x, m, q, left=None, bad=None):
    """Stage-count pmf in plain Python floats (math.comb, math.exp)."""
    if x < 0:
        return 0.0
    if model == BIN:
        return math.comb(m, x) * q ** x * (1 - q) ** (m - x) if x <= m else 0.0
    if model == POI:
        lam = m * q
        return math.exp(-lam) * lam ** x / math.factorial(x)
    if x > bad or m - x > left - bad or m - x < 0:
        return 0.0
    return math.comb(bad, x) * math.comb(left - bad, m - x) / math.comb(left, m)


def f64_stage_dp(model, stages, p, lot_size=None):
    """The stage recursion of :func:`mp_stage_dp` in plain Python floats.

    Independent of scipy and numpy (used by the self-test's naive scans);
    the rejection mass is 1 - P(X_j < r_j - d), fine at this use's 1e-12.
    """
    D = lot_defectives(p, lot_size) if model == HYP else None
    cont, prev, acc, rej = {0: 1.0}, 0, [], []
    for n, a, r in stages:
        m, aa = n - prev, _accept_cut(a)
        new, rj = defaultdict(float), 0.0
        for d, w in cont.items():
            left, bad = (lot_size - prev, D - d) if model == HYP else (None, None)
            below = 0.0
            for x in range(max(r - d, 0)):
                v = _plain_pmf(model, x, m, p, left, bad)
                new[d + x] += w * v
                below += v
            rj += w * max(1.0 - below, 0.0)
        acc.append(sum(v for d, v in new.items() if d <= aa))
        rej.append(rj)
        cont = {d: v for d, v in new.items() if aa < d < r and v > 0}
        prev = n
    return acc, rej


# --------------------------------------------------------------------------
# Design selection shared by the double and multiple searches
# --------------------------------------------------------------------------


class Candidate:
    """A feasible plan in a design search.

    ``crit`` is the criterion (double precision), ``size`` the largest
    sample, ``ratio`` = max(risk1/alpha, risk2/beta) and ``ints`` the final
    lexicographic tie-break; ``plan`` identifies the plan.
    """

    __slots__ = ("crit", "size", "ratio", "ints", "plan")

    def __init__(self, crit, size, ratio, ints, plan):
        self.crit, self.size, self.ratio = float(crit), int(size), float(ratio)
        self.ints, self.plan = tuple(ints), plan


def pick(cands, mp_ratio, notes, tag):
    """The best of ``cands`` (all with tied criteria) by (size, ratio, ints).

    Ratios within 1e-9 of the best one at the same size are re-evaluated at
    50 digits by ``mp_ratio(plan)`` before the tie-break on ``ints``.
    """
    cands = sorted(cands, key=lambda c: (c.size, c.ratio, c.ints))
    first = cands[0]
    close = [c for c in cands if c.size == first.size
             and c.ratio <= first.ratio * (1 + 1e-9)]
    if len(close) > 1:
        exact = sorted(((mp_ratio(c.plan), c.ints, i) for i, c in enumerate(close)))
        if exact[0][0] == exact[1][0]:
            notes.append(f"{tag}: {sum(e[0] == exact[0][0] for e in exact)} plans equal in "
                         "criterion, size and risks (identical in effect); lexicographic rule")
        elif exact[1][0] - exact[0][0] < 1e-12 * exact[0][0]:
            notes.append(f"{tag}: ratio tie-break decided by < 1e-12 relative")
        return close[exact[0][2]]
    return first


def select(cands, mp_ratio, notes, tag):
    """Winner and runner-up of a design search.

    The winner: among the candidates whose criterion is within TIE
    (relative) of the smallest one, the best by :func:`pick`.  The runner-up:
    the same rule applied to the candidates above that band, i.e. the plan
    with the second-best criterion value.  Returns (winner, runner_up or
    None, number of candidates in the winner's tie band).
    """
    v = min(c.crit for c in cands)
    band = [c for c in cands if c.crit <= v * (1 + TIE)]
    rest = [c for c in cands if c.crit > v * (1 + TIE)]
    fuzzy = [c for c in cands if 1e-14 < c.crit / v - 1 < 1e-10]
    if fuzzy:
        notes.append(f"{tag}: {len(fuzzy)} criterion values within 1e-14..1e-10 of the best "
                     "(the tie band edge)")
    win = pick(band, mp_ratio, notes, tag)
    run = None
    if rest:
        v2 = min(c.crit for c in rest)
        run = pick([c for c in rest if c.crit <= v2 * (1 + TIE)], mp_ratio, notes, tag)
    return win, run, len(band)


class Feasibility:
    """Double-precision feasibility with 50-digit re-checks at the margins.

    ``sure`` entries meet both points with a relative margin of MARGIN;
    entries within MARGIN of a threshold (and not clearly outside) are
    decided by ``mp_check(plan) -> bool``, memoised.
    """

    def __init__(self, alpha, beta, mp_check):
        self.alpha, self.beta, self.mp_check = alpha, beta, mp_check
        self.memo, self.rechecked = {}, 0

    def masks(self, pr, cr):
        sure = (pr <= self.alpha * (1 - MARGIN)) & (cr <= self.beta * (1 - MARGIN))
        maybe = (pr <= self.alpha * (1 + MARGIN)) & (cr <= self.beta * (1 + MARGIN)) & ~sure
        return sure, maybe

    def decide(self, plan):
        if plan not in self.memo:
            self.memo[plan] = self.mp_check(plan)
            self.rechecked += 1
        return self.memo[plan]


# --------------------------------------------------------------------------
# Double designs
# --------------------------------------------------------------------------


def _lowest_open(c1):
    """The lowest first count that goes on: c1 + 1, or 0 when c1 is None."""
    return 0 if c1 is None else c1 + 1


def double_stages(n1, c1, r1, n2, c2):
    """Stages of the double plan (n1, c1, r1, n2, c2)."""
    return [[n1, c1, r1], [n1 + n2, c2, c2 + 1]]


def asn_max_quality_f64(model, n1, c1, r1):
    """Quality maximising P(c1 < X1 < r1), hence ASN(p) = n1 + n2 P(...).

    Setting the derivative to zero: binomial dF(k; n, p)/dp =
    -n C(n-1, k) p^k (1-p)^(n-1-k), so C(n-1, r1-1) p^(r1-1) (1-p)^(n-r1) =
    C(n-1, c1) p^c1 (1-p)^(n-1-c1), i.e.

        p/(1-p) = [C(n1-1, c1) / C(n1-1, r1-1)]^(1/(r1-1-c1))      (r1 <= n1);

    for r1 > n1, P = P(X1 > c1) rises to 1 as p -> 1 (returns 1.0, the
    supremum).  Poisson: dF(k; lam)/dlam = -pois(k; lam), so
    pois(r1-1; lam) = pois(c1; lam), lam* = ((r1-1)!/c1!)^(1/(r1-1-c1)),
    p* = lam*/n1.  ``n1`` may be an array.
    """
    n1 = np.asarray(n1, float)
    e = r1 - 1 - c1
    if model == POI:
        lam = np.exp((sps.gammaln(r1) - sps.gammaln(c1 + 1)) / e)
        return lam / n1
    with np.errstate(invalid="ignore"):  # -inf - -inf where r1 > n1 (masked below)
        lt = (_ln_comb(n1 - 1, c1) - _ln_comb(n1 - 1, r1 - 1)) / e
    return np.where(r1 <= n1, sps.expit(np.where(np.isfinite(lt), lt, 0.0)), 1.0)


def mp_asn_max_double(model, n1, c1, r1, n2, lot_size=None):
    """max_p ASN(p) of a double plan at 50 digits, and the maximising quality.

    Binomial / Poisson: the closed-form maximiser of
    :func:`asn_max_quality_f64` evaluated in mpmath, P(c1 < X1 < r1) summed
    from exact pmf terms (binomial with r1 > n1: the supremum n1 + n2 at
    p -> 1, quality 1.0).  Hypergeometric: the largest value over every
    whole D = 0..N at 50 digits (the first such D on ties); the quality
    returned is D/N.
    """
    ds = range(c1 + 1, r1)
    if model == BIN:
        if r1 > n1:
            return mpf(n1 + n2), 1.0
        t = (mpf(math.comb(n1 - 1, c1)) / math.comb(n1 - 1, r1 - 1)) ** (mpf(1) / (r1 - 1 - c1))
        p = t / (1 + t)
        inc = MpIncrement(BIN, n1, p)
        pmid = mp.fsum(inc.pmf(d) for d in ds)
        return n1 + n2 * pmid, to_float(p)
    if model == POI:
        lam = (mp.factorial(r1 - 1) / mp.factorial(c1)) ** (mpf(1) / (r1 - 1 - c1))
        pmid = mp.fsum(mp.exp(-lam) * lam ** d / mp.factorial(d) for d in ds)
        return n1 + n2 * pmid, to_float(lam / n1)
    N = lot_size
    best = max(((mp.fsum(MpIncrement(HYP, n1, 0, N, D).pmf(d) for d in ds), D)
                for D in range(N + 1)), key=lambda t: (t[0], -t[1]))
    return n1 + n2 * best[0], to_float(Fraction(best[1], N))


class DoubleSearch:
    """Exhaustive double-plan design over the box of the brief.

    Plans (n1, c1, r1, n2, c2) with 0 <= c1 < c2 <= 2 c_single + 4,
    c1 + 2 <= r1 <= c2 + 1, and for asn-aql / asn-rql also first stages
    that cannot accept (c1 = None: 1 <= r1 <= c2 + 1, the first sample
    rejects at r1 or goes on), 1 <= n1 <= n_single, 1 <= n2 <= 4 n_single
    (n2 = ratio n1 when ``second_ratio`` is set), and for the unit-count
    models c1 < n1, c2 < n1 + n2, n1 + n2 <= N.

    Double precision, vectorised: for binomial / Poisson the stage counts
    do not depend on the past, so for each (c1, r1, c2)

        Pa[n1, n2]   = F1(c1) + sum_{d=c1+1}^{r1-1} f1(d) F2(c2 - d)
        risk1[n1, n2] = S1(r1 - 1) + sum_d f1(d) S2(c2 - d)

    are matrix products of scipy.stats tables (F cdf, S sf, f pmf; n1 along
    rows, n2 along columns).  Hypergeometric: one block per n1, the
    first-stage pmf from exact integers (the criteria use it), the
    second-stage tables HG(N - n1, D - d, n2) from log-gamma pmfs; both
    tails are sums of terms.  Criteria: asn-aql / asn-rql
    n1 + n2 P(c1 < X1 < r1) at p1 / p2; asn-max the same at the maximising
    quality (:func:`asn_max_quality_f64`; hypergeometric: max over D).
    """

    def __init__(self, model, p1, alpha, p2, beta, lot_size, criterion, second_ratio,
                 notes):
        self.model, self.p1, self.alpha, self.p2, self.beta = model, p1, alpha, p2, beta
        self.N, self.criterion, self.ratio = lot_size, criterion, second_ratio
        self.notes = notes
        single = DesignProblem(model, p1, alpha, p2, beta, lot_size).solve()
        self.ns, self.cs = single["n"], single["c"]
        self.K = 2 * self.cs + 4
        self.tag = (f"double {model} p1={p1} p2={p2} N={lot_size} {criterion}"
                    f" ratio={second_ratio}")
        self.feas = Feasibility(alpha, beta, self._mp_feasible)
        self._stage1 = {}  # hypergeometric asn-max: stage-1 pmf over D for one n1
        firsts = (lambda c2: ([None] if criterion != "asn-max" else []) + list(range(c2)))
        self.triples = [(c1, r1, c2) for c2 in range(1, self.K + 1) for c1 in firsts(c2)
                        for r1 in range(_lowest_open(c1) + 1, c2 + 2)]

    # -- 50-digit evaluations -------------------------------------------
    def _mp_eval(self, plan):
        pr, cr, _, _ = mp_risks(self.model, double_stages(*plan), self.p1, self.p2, self.N)
        return pr, cr

    def _mp_feasible(self, plan):
        pr, cr = self._mp_eval(plan)
        return pr <= mpf(self.alpha) and cr <= mpf(self.beta)

    def _mp_ratio(self, plan):
        pr, cr = self._mp_eval(plan)
        return max(pr / mpf(self.alpha), cr / mpf(self.beta))

    def mp_criterion(self, plan):
        """Criterion at 50 digits and the quality where it is taken."""
        n1, c1, r1, n2, c2 = plan
        if self.criterion == "asn-max":
            return mp_asn_max_double(self.model, n1, c1, r1, n2, self.N)
        p = self.p1 if self.criterion == "asn-aql" else self.p2
        acc, rej = mp_stage_dp(self.model, double_stages(*plan), p, self.N)
        return measures_from(acc, rej, double_stages(*plan), p, self.N)[1], p

    # -- double-precision blocks -----------------------------------------
    def _blocks(self):
        """Yield (n1 column, n2 row, triple, risk1, risk2, cont1, cont2) arrays."""
        model, K = self.model, self.K
        dd = np.arange(K + 2)
        n2max = 4 * self.ns
        if model != HYP:
            n1s, n2s = np.arange(1, self.ns + 1), np.arange(1, n2max + 1)
            tabs = []
            for q in (self.p1, self.p2):
                f1 = count_pmf(model, dd[None, :], n1s[:, None], q)
                F1, S1 = count_cdf_sf(model, dd[None, :], n1s[:, None], q)
                F2, S2 = count_cdf_sf(model, dd[:K + 1, None], n2s[None, :], q)
                tabs.append((f1, F1, S1, F2, S2))
            for c1, r1, c2 in self.triples:
                ds = np.arange(_lowest_open(c1), r1)
                ks = c2 - ds
                (f1a, F1a, S1a, F2a, S2a), (f1b, F1b, S1b, F2b, S2b) = tabs
                pr = S1a[:, r1 - 1][:, None] + f1a[:, ds] @ S2a[ks, :]
                first = 0.0 if c1 is None else F1b[:, c1][:, None]
                cr = first + f1b[:, ds] @ F2b[ks, :]
                yield (n1s[:, None], n2s[None, :], (c1, r1, c2), pr, cr,
                       f1a[:, ds].sum(1)[:, None], f1b[:, ds].sum(1)[:, None])
            return
        N = self.N
        Dq = [lot_defectives(q, N) for q in (self.p1, self.p2)]
        for n1 in range(1, min(self.ns, N - 1) + 1):
            n2s = np.arange(1, min(n2max, N - n1) + 1)
            tabs = []
            for D in Dq:
                # pmf over the whole support k = 0..D, so that both tails are
                # sums of terms (the upper one summed from the top).
                kk = np.arange(max(D, K + 1) + 1)
                f1 = hyper_pmf_exact(kk, N, D, n1)  # the criterion uses it: full accuracy
                F1, S1 = np.cumsum(f1), _upper_sums(f1, 0)
                f2 = hyper_pmf(kk[None, :, None], N - n1, D - dd[:K + 1, None, None],
                               n2s[None, None, :])  # [d, k, n2]
                F2, S2 = np.cumsum(f2, axis=1), _upper_sums(f2, 1)
                tabs.append((f1, F1, S1, F2, S2))
            (f1a, F1a, S1a, F2a, S2a), (f1b, F1b, S1b, F2b, S2b) = tabs
            for c1, r1, c2 in self.triples:
                ds = np.arange(_lowest_open(c1), r1)
                ks = c2 - ds
                pr = S1a[r1 - 1] + (f1a[ds][:, None] * S2a[ds, ks, :]).sum(0)
                first = 0.0 if c1 is None else F1b[c1]
                cr = first + (f1b[ds][:, None] * F2b[ds, ks, :]).sum(0)
                yield (np.array([[n1]]), n2s[None, :], (c1, r1, c2), pr[None, :], cr[None, :],
                       np.array([[f1a[ds].sum()]]), np.array([[f1b[ds].sum()]]))

    def _crit(self, n1, n2, c1, r1, cont1, cont2):
        """The criterion over a block (cont = P(c1 < X1 < r1) at p1, p2)."""
        if self.criterion == "asn-aql":
            return n1 + n2 * cont1
        if self.criterion == "asn-rql":
            return n1 + n2 * cont2
        if self.model == HYP:
            n1v = int(n1[0, 0])
            if n1v not in self._stage1:
                self._stage1 = {n1v: np.array([hyper_pmf_exact(range(self.K + 1), self.N, D, n1v)
                                               for D in range(self.N + 1)])}
            pm = self._stage1[n1v][:, c1 + 1:r1].sum(1)  # P(c1 < X1 < r1) for D = 0..N
            return n1 + n2 * pm.max()
        pstar = asn_max_quality_f64(self.model, n1[:, 0], c1, r1)
        ds = np.arange(c1 + 1, r1)
        if self.model == BIN:
            pm = st.binom.pmf(ds[None, :], n1, pstar[:, None]).sum(1)
        else:
            pm = st.poisson.pmf(ds[None, :], n1 * pstar[:, None]).sum(1)
        return n1 + n2 * pm[:, None]

    def run(self):
        """Exhaustive search; returns the fixture row.

        Each block keeps only its entries within TIE of its smallest
        criterion value and within TIE of its next value above that band:
        the global best band and the runner-up band are always among them.
        """
        t0 = time.perf_counter()
        kept, n_feasible = [], 0
        for n1, n2, (c1, r1, c2), pr, cr, cont1, cont2 in self._blocks():
            valid = np.ones(pr.shape, bool)
            if self.model != POI:
                valid &= (n1 >= _lowest_open(c1)) & (n1 + n2 > c2)
            if self.ratio is not None:
                valid &= n2 == self.ratio * n1
            sure, maybe = self.feas.masks(pr, cr)
            feas = valid & sure
            for i, j in zip(*np.nonzero(valid & maybe)):
                plan = (int(n1[i, 0]), c1, r1, int(n2[0, j]), c2)
                feas[i, j] = self.feas.decide(plan)
            if not feas.any():
                continue
            n_feasible += int(feas.sum())
            crit = np.broadcast_to(self._crit(n1, n2, c1, r1, cont1, cont2), pr.shape)
            cf = np.where(feas, crit, np.inf)
            cmin = cf.min()
            sel = cf <= cmin * (1 + TIE)
            above = cf[~sel]
            if np.isfinite(above).any():
                sel |= cf <= above.min() * (1 + TIE)
            for i, j in zip(*np.nonzero(sel)):
                a, b = int(n1[i, 0]), int(n2[0, j])
                ratio = max(pr[i, j] / self.alpha, cr[i, j] / self.beta)
                # A first stage that cannot accept comes before every c1.
                kept.append(Candidate(crit[i, j], a + b, ratio,
                                      (c2, -1 if c1 is None else c1, r1, a),
                                      (a, c1, r1, b, c2)))
        win, run, tied = select(kept, self._mp_ratio, self.notes, self.tag)
        return self._row(win, run, tied, n_feasible, time.perf_counter() - t0)

    def _row(self, win, run, tied, n_feasible, secs):
        plan = win.plan
        n1, c1, r1, n2, c2 = plan
        pr, cr = self._mp_eval(plan)
        assert pr <= mpf(self.alpha) and cr <= mpf(self.beta), self.tag
        val, where = self.mp_criterion(plan)
        assert abs(val - mpf(win.crit)) <= 1e-9 * val, (self.tag, val, win.crit)
        row = dict(model=self.model, lot_size=self.N, p1=self.p1, alpha=self.alpha,
                   p2=self.p2, beta=self.beta, criterion=self.criterion,
                   second_ratio=self.ratio, n1=n1, c1=c1, r1=r1, n2=n2, c2=c2,
                   criterion_value=to_float(val), criterion_quality=where,
                   producer_risk=to_float(pr), consumer_risk=to_float(cr),
                   n_single=self.ns, c_single=self.cs, tied_plans=tied)
        if run is None:
            row.update(runner_up=None, runner_up_gap=None)
        else:
            rpr, rcr = self._mp_eval(run.plan)
            assert rpr <= mpf(self.alpha) and rcr <= mpf(self.beta), self.tag
            rval, _ = self.mp_criterion(run.plan)
            gap = (rval - val) / val
            assert gap > 0, self.tag
            row.update(runner_up=dict(zip(("n1", "c1", "r1", "n2", "c2"), run.plan),
                                      criterion_value=to_float(rval)),
                       runner_up_gap=to_float(gap))
            if gap < 1e-6:
                self.notes.append(f"{self.tag}: runner-up gap {float(gap):.3g}")
        edges = [name for name, hit in (("n1 = n_single", n1 == self.ns),
                                        ("n2 = 4 n_single", n2 == 4 * self.ns),
                                        ("c2 = 2 c_single + 4", c2 == self.K)) if hit]
        if edges:
            self.notes.append(f"{self.tag}: winner on the box edge ({', '.join(edges)})")
        self.notes.append(f"{self.tag}: {n_feasible} feasible plans, {tied} tied, "
                          f"{self.feas.rechecked} margin re-checks, {secs:.2f} s")
        return row


# --------------------------------------------------------------------------
# Multiple designs (the designer's restricted family)
# --------------------------------------------------------------------------

#: The intercept grid for u and v.
UV_GRID = (0.5, 1.0, 1.5, 2.0, 2.5, 3.0, 3.5, 4.0)


def design_slope(model, p1, p2):
    """The SPRT slope s of :func:`wald_lines` (binomial formula for hypergeometric)."""
    return wald_lines(model, p1, 0.05, p2, 0.10)[2]


def family_stages(model, s, k, m, c, u, v):
    """The plan of the family for (k, m, c, u, v), or None when it is skipped.

    For j < k, with n_j = j m and s * n_j evaluated in binary64:
    a_j = floor(s n_j - u) (None if negative), capped at c - 1 (None if that
    is negative); r_j = ceil(s n_j + v), capped at c + 1, then raised to at
    least a_j + 2 (1 when a_j is None); unit-count models: a_j >= n_j becomes
    n_j - 1, and a plan left with a_j + 2 > r_j is skipped.  The last stage
    is [k m, c, c + 1] (skipped for the unit-count models when c >= k m).
    """
    stages = []
    for j in range(1, k):
        n = j * m
        a = math.floor(s * n - u)
        a = None if a < 0 else min(a, c - 1)
        if a is not None and a < 0:
            a = None
        r = min(math.ceil(s * n + v), c + 1)
        r = max(r, 1 if a is None else a + 2)
        if model != POI and a is not None and a >= n:
            a = n - 1
            if a + 2 > r:
                return None
        stages.append((n, a, r))
    if model != POI and c >= k * m:
        return None
    stages.append((k * m, c, c + 1))
    return tuple(stages)


def batch_outcomes(model, plans, m, c, q):
    """Stage decision probabilities of equal-stage plans, vectorised (f64).

    All plans share the stage size m and final acceptance number c, so the
    undecided counts stay in 0..c and every stage convolves with the same
    stage-count pmf f (scipy.stats): new = w @ T with T[d, d'] = f(d' - d),
    and the mass pushed past c is w @ S with S[d] = P(X > c - d).  Returns
    arrays acc[b, j], rej[b, j].
    """
    B, k = len(plans), len(plans[0])
    x = np.arange(c + 2)
    f = count_pmf(model, x, m, q)
    T = np.zeros((c + 1, c + 1))
    for d in range(c + 1):
        T[d, d:] = f[:c + 1 - d]
    S = count_cdf_sf(model, c - np.arange(c + 1), m, q)[1]
    A = np.array([[_accept_cut(s[1]) for s in p] for p in plans])
    R = np.array([[s[2] for s in p] for p in plans])
    w = np.zeros((B, c + 1))
    w[:, 0] = 1.0
    acc, rej = np.zeros((B, k)), np.zeros((B, k))
    dcol = np.arange(c + 1)[None, :]
    for j in range(k):
        new, past = w @ T, w @ S
        a, r = A[:, j][:, None], R[:, j][:, None]
        acc[:, j] = np.where(dcol <= a, new, 0.0).sum(1)
        rej[:, j] = past + np.where(dcol >= r, new, 0.0).sum(1)
        w = np.where((dcol > a) & (dcol < r), new, 0.0)
    return acc, rej


class MultipleSearch:
    """Search of the multiple-plan family (see :func:`family_stages`).

    m = 1..n_single, c = 0..2 c_single + 2, u, v over UV_GRID; plans that
    meet both points; minimise ASN at p1, ties (TIE) by k m, then
    max(risk1/alpha, risk2/beta), then (c, u, v).  Identical stage lists
    from different (u, v) are evaluated once, under their smallest (u, v).
    m runs upwards and stops once m exceeds the best ASN (ASN >= m).
    Double precision (scipy.stats, :func:`batch_outcomes`); margins and the
    winner re-checked at 50 digits.
    """

    def __init__(self, model, p1, alpha, p2, beta, k, notes, lot_size=None):
        assert model in (BIN, POI), "the family search is written for binomial / Poisson"
        self.model, self.p1, self.alpha, self.p2, self.beta = model, p1, alpha, p2, beta
        self.k, self.N, self.notes = k, lot_size, notes
        single = DesignProblem(model, p1, alpha, p2, beta, lot_size).solve()
        self.ns, self.cs = single["n"], single["c"]
        self.s = design_slope(model, p1, p2)
        self.tag = f"multiple {model} p1={p1} p2={p2} k={k}"
        self.feas = Feasibility(alpha, beta, self._mp_feasible)

    def _mp_feasible(self, stages):
        pr, cr, _, _ = mp_risks(self.model, stages, self.p1, self.p2, self.N)
        return pr <= mpf(self.alpha) and cr <= mpf(self.beta)

    def _mp_ratio(self, key):
        stages = key[0]
        pr, cr, _, _ = mp_risks(self.model, stages, self.p1, self.p2, self.N)
        return max(pr / mpf(self.alpha), cr / mpf(self.beta))

    def run(self):
        """The search; returns the fixture row (winner re-checked at 50 digits)."""
        t0 = time.perf_counter()
        cands, best = [], math.inf
        sizes = np.arange(1, self.k + 1)
        for m in range(1, self.ns + 1):
            if m > best * (1 + TIE):
                break
            for c in range(2 * self.cs + 3):
                plans = {}
                for u, v in itertools.product(UV_GRID, UV_GRID):
                    stages = family_stages(self.model, self.s, self.k, m, c, u, v)
                    if stages is not None and stages not in plans:
                        plans[stages] = (u, v)
                if not plans:
                    continue
                keys = list(plans)
                acc1, rej1 = batch_outcomes(self.model, keys, m, c, self.p1)
                acc2, _ = batch_outcomes(self.model, keys, m, c, self.p2)
                pr, cr = rej1.sum(1), acc2.sum(1)
                asn = ((acc1 + rej1) * (sizes * m)[None, :]).sum(1)
                sure, maybe = self.feas.masks(pr, cr)
                for b, key in enumerate(keys):
                    if not (sure[b] or (maybe[b] and self.feas.decide(key))):
                        continue
                    u, v = plans[key]
                    cands.append(Candidate(asn[b], self.k * m,
                                           max(pr[b] / self.alpha, cr[b] / self.beta),
                                           (c, u, v), (key, c, u, v)))
                    best = min(best, asn[b])
        win, run, tied = select(cands, self._mp_ratio, self.notes, self.tag)
        stages, c, u, v = win.plan
        check_plan(self.model, stages, self.N)
        pr, cr, acc1, rej1 = mp_risks(self.model, stages, self.p1, self.p2, self.N)
        assert pr <= mpf(self.alpha) and cr <= mpf(self.beta), self.tag
        asn = measures_from(acc1, rej1, stages, self.p1, self.N)[1]
        assert abs(asn - mpf(win.crit)) <= 1e-9 * asn, self.tag
        gap = None
        if run is not None:
            r_stages = run.plan[0]
            acc_r, rej_r = mp_stage_dp(self.model, r_stages, self.p1, self.N)
            gap = (measures_from(acc_r, rej_r, r_stages, self.p1, self.N)[1] - asn) / asn
            assert gap > 0, self.tag
        m = stages[0][0]
        self.notes.append(f"{self.tag}: {len(cands)} feasible plans, {tied} tied, "
                          f"{self.feas.rechecked} margin re-checks, "
                          f"{time.perf_counter() - t0:.2f} s")
        if m == self.ns or c == 2 * self.cs + 2:
            self.notes.append(f"{self.tag}: winner on the box edge (m={m}, c={c})")
        return dict(model=self.model, lot_size=self.N, p1=self.p1, alpha=self.alpha,
                    p2=self.p2, beta=self.beta, k=self.k, m=m, c=c, u=u, v=v,
                    stages=[list(s) for s in stages], asn_p1=to_float(asn),
                    producer_risk=to_float(pr), consumer_risk=to_float(cr),
                    slope=self.s, n_single=self.ns, c_single=self.cs,
                    runner_up_gap=None if gap is None else to_float(gap))


# --------------------------------------------------------------------------
# Fixture cases
# --------------------------------------------------------------------------

#: Staged plans of the measures section.
PLAN_50_150 = [[50, 1, 4], [150, 3, 4]]
PLAN_20_40 = [[20, 0, 3], [40, 3, 4]]
PLAN_NULL_FIRST = [[30, None, 3], [60, 2, 3]]
PLAN_THREE = [[25, 0, 3], [50, 2, 4], [75, 4, 5]]
PLAN_SEVEN = [[20 * j, a, r] for j, (a, r) in
              enumerate([(None, 2), (0, 3), (1, 4), (2, 5), (3, 6), (4, 6), (6, 7)], 1)]
STAGED_PLANS = [PLAN_50_150, PLAN_20_40, PLAN_NULL_FIRST, PLAN_THREE, PLAN_SEVEN]


def _hyp_quality(D, N):
    """p = D/N, checked to round back to D (AOQ uses p as given)."""
    p = D / N
    assert lot_defectives(p, N) == D
    return p


# (model, stages, p, lot_size)
STAGED_CASES = (
    [(BIN, s, p, None) for s in STAGED_PLANS for p in (0.002, 0.01, 0.03, 0.08)]
    + [(POI, s, p, None) for s in STAGED_PLANS for p in (0.002, 0.01, 0.03, 0.08)]
    + [(HYP, s, _hyp_quality(D, 500), 500) for s in STAGED_PLANS for D in (1, 5, 15, 40)]
    + [(HYP, s, _hyp_quality(D, 1000), 1000) for s in (PLAN_50_150, PLAN_SEVEN)
       for D in (2, 20, 50)]
    + [(BIN, PLAN_50_150, p, 2000) for p in (0.01, 0.05)]
    + [(BIN, PLAN_SEVEN, 0.03, 1000), (POI, PLAN_THREE, 0.03, 1000)]
    + [(BIN, PLAN_20_40, 0.3, None), (POI, PLAN_20_40, 0.5, None),
       (HYP, PLAN_20_40, _hyp_quality(25, 50), 50)]
)

# (model, p1, alpha, p2, beta, lot_size)
SEQUENTIAL_CASES = [
    (BIN, 0.01, 0.05, 0.06, 0.10, None),
    (BIN, 0.02, 0.05, 0.08, 0.10, None),
    (BIN, 0.005, 0.05, 0.03, 0.10, None),
    (BIN, 0.05, 0.05, 0.20, 0.10, None),
    (BIN, 0.01, 0.01, 0.06, 0.05, None),
    (BIN, 0.02, 0.01, 0.08, 0.05, None),
    (POI, 0.01, 0.05, 0.06, 0.10, None),
    (POI, 0.02, 0.05, 0.10, 0.10, None),
    (POI, 0.02, 0.01, 0.10, 0.05, None),
    (HYP, 0.02, 0.05, 0.08, 0.10, 500),
    (HYP, 0.02, 0.05, 0.08, 0.10, 2000),
]

# (model, p1, alpha, p2, beta, lot_size, criterion, second_ratio)
DOUBLE_CASES = [
    (BIN, 0.02, 0.05, 0.10, 0.10, None, "asn-aql", None),
    (BIN, 0.01, 0.05, 0.06, 0.10, None, "asn-aql", None),
    (BIN, 0.03, 0.05, 0.12, 0.10, None, "asn-aql", None),
    (BIN, 0.05, 0.05, 0.20, 0.10, None, "asn-aql", None),
    (BIN, 0.005, 0.05, 0.04, 0.10, None, "asn-aql", None),
    (BIN, 0.02, 0.05, 0.10, 0.10, None, "asn-rql", None),
    (BIN, 0.02, 0.05, 0.10, 0.10, None, "asn-max", None),
    (BIN, 0.05, 0.05, 0.20, 0.10, None, "asn-rql", None),
    (BIN, 0.05, 0.05, 0.20, 0.10, None, "asn-max", None),
    (POI, 0.02, 0.05, 0.10, 0.10, None, "asn-aql", None),
    (POI, 0.02, 0.05, 0.10, 0.10, None, "asn-max", None),
    (HYP, 0.02, 0.05, 0.10, 0.10, 300, "asn-aql", None),
    (HYP, 0.02, 0.05, 0.10, 0.10, 300, "asn-max", None),
    (HYP, 0.02, 0.05, 0.10, 0.10, 1000, "asn-aql", None),
    (BIN, 0.02, 0.05, 0.10, 0.10, None, "asn-aql", 2),
]

# (model, p1, alpha, p2, beta, k)
MULTIPLE_CASES = [
    (BIN, 0.02, 0.05, 0.10, 0.10, 3),
    (BIN, 0.02, 0.05, 0.10, 0.10, 5),
    (BIN, 0.02, 0.05, 0.10, 0.10, 7),
    (BIN, 0.01, 0.05, 0.06, 0.10, 3),
    (BIN, 0.01, 0.05, 0.06, 0.10, 5),
    (BIN, 0.01, 0.05, 0.06, 0.10, 7),
    (POI, 0.02, 0.05, 0.10, 0.10, 4),
]

PUBLISHED_QUALITIES = (0.01, 0.02, 0.05, 0.10)


# --------------------------------------------------------------------------
# Building the fixture
# --------------------------------------------------------------------------


def published_row(p):
    """Pa, first-stage acceptance and ASN of the textbook double plan."""
    acc, rej = mp_stage_dp(BIN, PLAN_50_150, p)
    pa, asn, _, _ = measures_from(acc, rej, PLAN_50_150, p, None)
    return dict(model=BIN, stages=PLAN_50_150, p=p, pa=to_float(pa),
                accept_first=to_float(acc[0]), reject_first=to_float(rej[0]),
                asn=to_float(asn))


def build_fixture(notes, timings):
    """Assemble the whole fixture as a plain dict; section timings in ``timings``."""
    out = {}

    def timed(name, fn):
        t = time.perf_counter()
        out[name] = fn()
        timings[name] = time.perf_counter() - t

    timed("staged_measures", lambda: [staged_measures_row(m, s, p, L)
                                      for m, s, p, L in STAGED_CASES])
    timed("sequential", lambda: [sequential_row(*c) for c in SEQUENTIAL_CASES])
    for row in out["sequential"]:
        if row["truncation"] is None:
            notes.append(f"sequential {row['model']} p1={row['p1']} p2={row['p2']}: "
                         f"{row['reason']}")
        else:
            notes.append(f"sequential {row['model']} p1={row['p1']} p2={row['p2']} "
                         f"a={row['alpha']} b={row['beta']} N={row['lot_size']}: n_t="
                         f"{row['truncation']} a_t={row['final_acceptance']} "
                         f"(n_single={row['n_single']})")
    timed("double_designs", lambda: [DoubleSearch(*c, notes).run() for c in DOUBLE_CASES])
    timed("multiple_designs", lambda: [MultipleSearch(*c, notes).run()
                                       for c in MULTIPLE_CASES])
    timed("published_double", lambda: [published_row(p) for p in PUBLISHED_QUALITIES])
    return out


# --------------------------------------------------------------------------
# Self-test: brute force against the recursions and the searches
# --------------------------------------------------------------------------


def _frac(x):
    return Fraction(x)


def _enumerate_plan(model, stages, p, lot_size=None, pois_cap=None):
    """Explicit enumeration of every unit sequence (exact for binomial and
    hypergeometric, Fractions; Poisson: per-unit counts 0..cap, the last
    value standing for ">= cap", with 50-digit weights).

    Each sequence is followed unit by unit with the plain rules: full
    inspection decides at the end of a stage; the curtailed walk stops at
    the first unit (or stage entry) where d >= r_j or (unit-count models)
    d + units left in the stage <= a_j.  Returns (acc, rej, curtailed ASN).
    """
    k, n_max = len(stages), stages[-1][0]
    acc, rej = [0] * k, [0] * k
    units = 0
    if model == POI:
        vals = list(range(pois_cap + 1))
        P = mpf(p)
        probs = [mp.exp(-P) * P ** x / mp.factorial(x) for x in range(pois_cap)]
        probs.append(1 - mp.fsum(probs))
    else:
        vals = (0, 1)
    D = lot_defectives(p, lot_size) if model == HYP else None
    for seq in itertools.product(vals, repeat=n_max):
        # probability of the sequence
        if model == BIN:
            q = _frac(p)
            w = Fraction(1)
            for x in seq:
                w *= q if x else 1 - q
        elif model == HYP:
            w, bad = Fraction(1), 0
            for i, x in enumerate(seq):
                left = lot_size - i
                w *= Fraction(D - bad, left) if x else Fraction(lot_size - D - (i - bad), left)
                bad += x
                if w == 0:
                    break
            if w == 0:
                continue
        else:
            w = mpf(1)
            for x in seq:
                w *= probs[x]
        cum = list(itertools.accumulate(seq))
        # full inspection
        decided = None
        for j, (n, a, r) in enumerate(stages):
            d = cum[n - 1]
            if d <= _accept_cut(a):
                acc[j] += w
                decided = j
                break
            if d >= r:
                rej[j] += w
                decided = j
                break
        assert decided is not None
        # curtailed walk
        prev, stop = 0, None
        for j, (n, a, r) in enumerate(stages):
            for i in range(prev, n + 1):
                d = cum[i - 1] if i else 0
                if d >= r or ((model != POI or i == n) and d + (n - i) <= _accept_cut(a)):
                    stop = i
                    break
            if stop is not None:
                break
            prev = n
        units += w * stop
    return acc, rej, units


def _mp_close(a, b, tol=mpf(10) ** -40):
    if isinstance(b, Fraction):
        b = mpf(b.numerator) / b.denominator
    return abs(mpf(a) - b) <= tol * max(abs(b), mpf(10) ** -300)


def self_test():
    """Run all cross-checks; raises AssertionError on the first failure."""
    t0 = time.time()
    # 1. Stage DP and item DP against enumeration of every unit sequence.
    tiny = [
        [[3, None, 2], [5, 1, 3], [8, 2, 3]],
        [[4, 0, 3], [7, 2, 3]],
        [[2, None, 3], [4, 0, 2], [6, 1, 4], [9, 3, 4]],
        [[5, 2, 3]],
        [[3, 0, 2], [6, 3, 4]],  # stage-2 acceptance certain on entry for d = 1
        [[4, 0, 4], [6, 2, 3]],  # entering stage 2 with d = 3 >= r_2: rejected at once
    ]
    k = 0
    for stages in tiny:
        check_plan(BIN, stages)
        for model, p, N in ((BIN, 0.1, None), (BIN, 0.37, None), (HYP, 4 / 12, 12),
                            (HYP, 7 / 12, 12), (HYP, 1 / 10, 10)):
            if model == HYP and stages[-1][0] > N:
                continue
            ea, er, eu = _enumerate_plan(model, stages, p, N)
            sa, sr = mp_stage_dp(model, stages, p, N)
            ia, ir, iu = mp_item_dp(model, stages, p, N)
            for x, y, z in zip(ea + er, sa + sr, ia + ir):
                assert _mp_close(y, x) and _mp_close(z, x), (model, stages, p)
            assert _mp_close(iu, eu), (model, stages, p, iu, eu)
            fa, fr = f64_stage_dp(model, stages, p, N)
            for x, y in zip(fa + fr, sa + sr):
                assert abs(x - float(y)) <= 1e-12, (model, stages, p)
            k += 1
    for stages in ([[1, None, 2], [2, 0, 3], [3, 1, 2]], [[2, 0, 3], [4, 2, 3]],
                   [[3, 1, 2]], [[1, None, 3], [3, 1, 3], [4, 2, 3]]):
        for p in (0.3, 1.2):
            cap = max(s[2] for s in stages)
            ea, er, eu = _enumerate_plan(POI, stages, p, pois_cap=cap)
            sa, sr = mp_stage_dp(POI, stages, p)
            ia, ir, iu = mp_item_dp(POI, stages, p)
            for x, y, z in zip(ea + er, sa + sr, ia + ir):
                assert _mp_close(y, x, mpf(10) ** -35) and _mp_close(z, x, mpf(10) ** -35)
            assert _mp_close(iu, eu, mpf(10) ** -35), (stages, p, iu, eu)
            k += 1
    # single plans: the curtailed ASN agrees with make_reference's closed forms
    for n, c, p in ((10, 1, 0.1), (50, 3, 0.05), (20, 0, 0.3)):
        u = mp_item_dp(BIN, [[n, c, c + 1]], p)[2]
        assert _mp_close(u, ref.mp_asn_curtailed(BIN, n, c, p)), (n, c, p)
        u = mp_item_dp(HYP, [[n, c, c + 1]], 0.1, 100)[2]
        assert _mp_close(u, ref.mp_asn_curtailed(HYP, n, c, 0.1, 100)), (n, c)
    print(f"self-test: stage / item DP vs enumeration OK ({k} cases)")

    # 2. Sequential walk against enumeration for a short truncation.
    for model, p1, alpha, p2, beta, N in ((BIN, 0.05, 0.10, 0.5, 0.10, None),
                                          (BIN, 0.1, 0.2, 0.4, 0.2, None),
                                          (HYP, 0.1, 0.10, 0.5, 0.10, 20)):
        lines = wald_lines(model, p1, alpha, p2, beta)
        n_t, a_t, pr, cr, _ = truncation_search(model, lines, p1, alpha, p2, beta, N, 40)
        assert n_t is not None and n_t <= 14, (model, n_t)
        # every truncation n <= n_t and every a_t, by enumeration
        for n in range(1, n_t + 1):
            a_n, r_n = line_numbers(*lines, n)
            top = min(r_n - 1, n - 1)
            ok = []
            for a in range(max(_accept_cut(a_n), 0), top + 1):
                stages = sequential_stages(lines, n, a)
                e1 = _enumerate_plan(model, stages, p1, N)
                e2 = _enumerate_plan(model, stages, p2, N)
                r1, r2 = sum(e1[1]), sum(e2[0])
                if r1 <= _frac(alpha) and r2 <= _frac(beta):
                    ok.append((max(r1 / _frac(alpha), r2 / _frac(beta)), a, r1, r2))
            assert bool(ok) == (n == n_t), (model, n, ok)
        best = min(ok)
        assert best[1] == a_t and _mp_close(pr, best[2]) and _mp_close(cr, best[3])
    # the fixture's truncated plans: risks and OC again by the stage recursion
    for case in SEQUENTIAL_CASES:
        model, p1, alpha, p2, beta, N = case
        ha, hr, s = lines = wald_lines(model, p1, alpha, p2, beta)
        assert ha > 0 and hr > 0 and p1 < s < p2
        row = sequential_row(*case)
        stages = sequential_stages(lines, row["truncation"], row["final_acceptance"])
        acc1, rej1 = mp_stage_dp(model, stages, p1, N)
        acc2, _ = mp_stage_dp(model, stages, p2, N)
        assert to_float(mp.fsum(rej1)) == row["producer_risk"], case
        assert to_float(mp.fsum(acc2)) == row["consumer_risk"], case
        assert to_float(mp.fsum(acc1)) == row["points"][1]["pa"], case
    print("self-test: sequential truncation vs enumeration OK")

    # 3. asn-max closed forms against dense grids.
    for model in (BIN, POI):
        for n1, c1, r1 in ((20, 0, 3), (50, 1, 4), (13, 2, 6), (80, 0, 2), (5, 1, 8)):
            if model == BIN and r1 > n1:
                assert float(asn_max_quality_f64(BIN, n1, c1, r1)) == 1.0
                continue
            ps = np.linspace(1e-7, min(0.999999, 5.0 * r1 / n1), 400001)
            ds = np.arange(c1 + 1, r1)
            g = count_pmf(model, ds[None, :], n1, ps[:, None]).sum(1)
            v, where = mp_asn_max_double(model, n1, c1, r1, 1)
            assert float(v - n1) >= g.max() - 1e-15, (model, n1, c1, r1)
            assert float(v - n1) - g.max() < 1e-8, (model, n1, c1, r1)
            assert abs(where - ps[np.argmax(g)]) < 1e-3 * max(1, where)
    for N, n1, c1, r1 in ((300, 20, 0, 3), (300, 60, 1, 4), (1000, 40, 2, 5), (30, 3, 0, 5)):
        v, where = mp_asn_max_double(HYP, n1, c1, r1, 1, N)
        tot = math.comb(N, n1)
        exact = [sum(Fraction(math.comb(D, d) * math.comb(N - D, n1 - d), tot)
                     for d in range(c1 + 1, min(r1, n1 + 1))) for D in range(N + 1)]
        D = exact.index(max(exact))  # the first maximiser
        assert _mp_close(v - n1, exact[D]) and where == float(Fraction(D, N)), (N, n1, c1)
    print("self-test: asn-max closed forms OK")

    # 4. Vectorised double-design risks against the plain recursion.
    notes = []
    for model, p1, p2, N in ((BIN, 0.05, 0.3, None), (POI, 0.05, 0.3, None),
                             (HYP, 0.05, 0.3, 40)):
        srch = DoubleSearch(model, p1, 0.05, p2, 0.10, N, "asn-aql", None, notes)
        rng = np.random.default_rng(7)
        for n1, n2, (c1, r1, c2), pr, cr, cont1, _ in srch._blocks():
            for _ in range(3):
                i, j = rng.integers(pr.shape[0]), rng.integers(pr.shape[1])
                plan = (int(n1[i, 0]), c1, r1, int(n2[0, j]), c2)
                if model != POI and (plan[0] <= c1 or plan[0] + plan[3] <= c2):
                    continue
                pr_mp, cr_mp = srch._mp_eval(plan)
                tol = 1e-10 if model == HYP else 1e-12  # log-gamma stage-2 tables
                assert abs(pr[i, j] - float(pr_mp)) <= tol * float(pr_mp), (plan, pr[i, j])
                assert abs(cr[i, j] - float(cr_mp)) <= tol * float(cr_mp), (plan, cr[i, j])
                acc, rej = mp_stage_dp(model, double_stages(*plan), p1, N)
                assert abs(cont1[i, 0] - float(1 - acc[0] - rej[0])) <= 1e-14, plan
    # 5. the winners against a naive scan over a whole (small) box
    for model, p1, p2, N, ratio in ((BIN, 0.1, 0.5, None, None), (POI, 0.1, 0.5, None, None),
                                    (HYP, 0.1, 0.5, 30, None), (BIN, 0.1, 0.5, None, 2)):
        srch = DoubleSearch(model, p1, 0.10, p2, 0.10, N, "asn-aql", ratio, notes)
        naive = _naive_double(srch)
        for crit in ("asn-aql", "asn-rql", "asn-max"):
            row = DoubleSearch(model, p1, 0.10, p2, 0.10, N, crit, ratio, notes).run()
            got = (row["n1"], row["c1"], row["r1"], row["n2"], row["c2"])
            assert naive[crit] == got, (model, crit, naive[crit], got)
    print("self-test: double design vs naive scan OK")

    # 6. Multiple design: the search against naive loops over the family.
    for model, p1, p2, k in ((BIN, 0.1, 0.5, 3), (BIN, 0.1, 0.5, 4), (POI, 0.1, 0.5, 3),
                             (BIN, 0.02, 0.10, 3)):
        srch = MultipleSearch(model, p1, 0.10 if p1 == 0.1 else 0.05, p2, 0.10, k, notes)
        row = srch.run()
        naive = _naive_multiple(srch)
        assert naive == (row["m"], row["c"], row["u"], row["v"]), (model, k, naive, row)
    print(f"self-test: multiple design vs naive scan OK; all passed in {time.time() - t0:.1f} s")


def _naive_double(srch: DoubleSearch):
    """Double designs for all three criteria by looping over every plan of
    the box with the plain-float recursion :func:`f64_stage_dp` (asn-max from
    the 50-digit :func:`mp_asn_max_double`, memoised per first stage).
    Returns {criterion: (n1, c1, r1, n2, c2)}.
    """
    best, N, amax = {}, srch.N, {}
    for c1, r1, c2 in srch.triples:
        for n1 in range(1, srch.ns + 1):
            for n2 in range(1, 4 * srch.ns + 1):
                if srch.model != POI and (c1 >= n1 or c2 >= n1 + n2):
                    continue
                if N is not None and n1 + n2 > N:
                    continue
                if srch.ratio is not None and n2 != srch.ratio * n1:
                    continue
                stages = double_stages(n1, c1, r1, n2, c2)
                acc1, rej1 = f64_stage_dp(srch.model, stages, srch.p1, N)
                acc2, rej2 = f64_stage_dp(srch.model, stages, srch.p2, N)
                pr, cr = sum(rej1), sum(acc2)
                if pr > srch.alpha or cr > srch.beta:
                    continue
                if (n1, c1, r1) not in amax:
                    amax[n1, c1, r1] = mp_asn_max_double(srch.model, n1, c1, r1, 1, N)[0] - n1
                pmax = float(amax[n1, c1, r1])  # max_p P(c1 < X1 < r1)
                for crit, val in (("asn-aql", n1 + n2 * (1 - acc1[0] - rej1[0])),
                                  ("asn-rql", n1 + n2 * (1 - acc2[0] - rej2[0])),
                                  ("asn-max", n1 + n2 * pmax)):
                    key = (val, n1 + n2, max(pr / srch.alpha, cr / srch.beta), c2, c1, r1, n1)
                    old = best.get(crit)
                    if old is None or key[0] < old[0][0] * (1 - TIE) or (
                            key[0] <= old[0][0] * (1 + TIE) and key[1:] < old[0][1:]):
                        best[crit] = (key, (n1, c1, r1, n2, c2))
    return {k: v[1] for k, v in best.items()}


def _naive_multiple(srch: MultipleSearch):
    """The multiple design by looping over the whole family (f64 recursion)."""
    best = None
    for m in range(1, srch.ns + 1):
        for c in range(2 * srch.cs + 3):
            for u, v in itertools.product(UV_GRID, UV_GRID):
                stages = family_stages(srch.model, srch.s, srch.k, m, c, u, v)
                if stages is None:
                    continue
                acc1, rej1 = f64_stage_dp(srch.model, stages, srch.p1)
                acc2, _ = f64_stage_dp(srch.model, stages, srch.p2)
                pr, cr = sum(rej1), sum(acc2)
                if pr > srch.alpha or cr > srch.beta:
                    continue
                asn = sum((a + r) * s[0] for a, r, s in zip(acc1, rej1, stages))
                key = (asn, srch.k * m, max(pr / srch.alpha, cr / srch.beta), c, u, v)
                if best is None or key[0] < best[0][0] * (1 - TIE) or (
                        key[0] <= best[0][0] * (1 + TIE) and key[1:] < best[0][1:]):
                    best = (key, (m, c, u, v))
    return best[1]


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

    print(f"bench mp_stage_dp 7-stage binomial: "
          f"{med(lambda: mp_stage_dp(BIN, PLAN_SEVEN, 0.03), 20) * 1e3:.2f} ms")
    print(f"bench mp_item_dp 7-stage binomial: "
          f"{med(lambda: mp_item_dp(BIN, PLAN_SEVEN, 0.03), 20) * 1e3:.2f} ms")
    print(f"bench f64 double-design search binomial 2%/10% asn-aql: "
          f"{med(lambda: DoubleSearch(*DOUBLE_CASES[0], []).run(), 3):.2f} s")


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
        print(f"built in {time.time() - t0:.1f} s with scipy {scipy.__version__}, "
              f"numpy {np.__version__}, mpmath {mpmath.__version__}")
    return ref.write_or_check(FIXTURE, text, "make_staged_reference.py", args.check)


if __name__ == "__main__":
    sys.exit(main())
