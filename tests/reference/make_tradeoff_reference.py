#!/usr/bin/env python3
"""Reference values for lotsman's trade-off grid.

Writes ``tests/data/tradeoff_reference.json``: small grids of risk points in
which every cell is solved independently by the exhaustive exact design of
``make_reference.py`` (every c from 0 up, bisection over n on scipy.stats
tails), each chosen plan re-checked at 50 digits with mpmath, and, for a
grid with a lot size, the average total inspection ATI at a process quality
at 50 digits.  Nothing is shared between cells, so the fixture checks that
lotsman's warm-started grid gives each cell the answer of a cold design.

Usage (from the repository root)::

    python3 tests/reference/make_tradeoff_reference.py          # (re)write the fixture
    python3 tests/reference/make_tradeoff_reference.py --check  # exit 1 if it would change
    python3 tests/reference/make_tradeoff_reference.py --bench  # time the reference designer
                                                                # on the README's grid

Axis values are formed as lotsman forms ``LO:HI:COUNT``: ``lo + i * step``
with ``step = (hi - lo) / (count - 1)`` in binary64, rounded to 15 significant
digits, the last point ``hi`` itself.  They are stored in the fixture, so the comparison does not depend
on that rule.
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

from mpmath import mpf

sys.path.insert(0, str(Path(__file__).resolve().parent))
from make_reference import (  # noqa: E402  (importing it sets mp.dps = 50)
    BIN, HYP, POI, REPO, DesignProblem, mp_tails, parse_args, render, to_float, write_or_check,
)

FIXTURE = REPO / "tests" / "data" / "tradeoff_reference.json"

#: A chosen plan whose achieved risk lies this close (relative) to its limit
#: at 50 digits is flagged: an f64 design may land on either side.
NEAR_TIE = 1e-12


def axis(lo: float, hi: float, count: int) -> list[float]:
    """``count`` evenly spaced qualities from lo to hi, ends included, each
    rounded to 15 significant digits as lotsman does."""
    step = (hi - lo) / (count - 1)
    return [hi if i + 1 == count else float(f"{lo + step * i:.14e}") for i in range(count)]


def solve_cell(model, p1, alpha, p2, beta, lot_size):
    """The exhaustive design of one cell, checked at 50 digits."""
    if p1 >= p2:
        return dict(n=None, c=None, reason="aql_not_below_rql", near_tie=False)
    res = DesignProblem(model, p1, alpha, p2, beta, lot_size).solve()
    if res["n"] is None:
        return dict(n=None, c=None, reason="no_plan", near_tie=False)
    n, c = res["n"], res["c"]
    pa1, _ = mp_tails(model, n, c, p1, lot_size)
    pa2, _ = mp_tails(model, n, c, p2, lot_size)
    producer, consumer = 1 - pa1, pa2
    assert producer <= mpf(alpha) and consumer <= mpf(beta), (model, p1, p2, n, c)
    near = min(abs(producer - mpf(alpha)) / mpf(alpha), abs(consumer - mpf(beta)) / mpf(beta))
    return dict(n=n, c=c, reason=None, near_tie=bool(near < NEAR_TIE))


def mp_ati(model, n, c, p, lot_size):
    """ATI = n + (1 - Pa)(N - n) at 50 digits, 1 - Pa taken as the upper tail."""
    _, sf = mp_tails(model, n, c, p, lot_size)
    return to_float(n + sf * (lot_size - n))


GRIDS = [
    # (name, model, lot size, alpha, beta, aql axis, rql axis, process quality)
    ("binomial, the README's ranges", BIN, None, 0.05, 0.10,
     axis(0.002, 0.02, 10), axis(0.03, 0.12, 10), None),
    ("binomial, alpha 0.01, beta 0.05, overlapping ranges", BIN, None, 0.01, 0.05,
     axis(0.005, 0.04, 6), axis(0.025, 0.10, 7), None),
    ("poisson, nonconformities per unit", POI, None, 0.05, 0.10,
     axis(0.01, 0.2, 6), axis(0.1, 1.0, 6), None),
    ("hypergeometric, lot of 1500, with ATI at 0.8%", HYP, 1500, 0.05, 0.10,
     axis(0.002, 0.02, 6), axis(0.03, 0.12, 6), 0.008),
    ("hypergeometric, lot of 60 (some cells cannot be told apart)", HYP, 60, 0.05, 0.10,
     axis(0.01, 0.05, 5), axis(0.04, 0.2, 5), 0.02),
]


#: Sensitivity cases: (model, lot size, p1, alpha, p2, beta) and the steps
#: of p1, alpha, p2, beta. Each input moves one step each way, the others
#: stay, and each moved point is designed on its own.
SENSITIVITY = [
    ((BIN, None, 0.01, 0.05, 0.06, 0.10), (0.002, 0.01, 0.01, 0.02)),
    ((HYP, 500, 0.005, 0.05, 0.04, 0.10), (0.001, 0.01, 0.01, 0.02)),
    ((POI, None, 0.05, 0.05, 0.4, 0.10), (0.01, 0.01, 0.2, 0.02)),
    # Steps that push p1 onto p2 and alpha to 0: no plan there.
    ((BIN, None, 0.05, 0.02, 0.06, 0.10), (0.01, 0.02, 0.01, 0.05)),
]


def decimal(x: float) -> float:
    """``x`` rounded to 12 significant digits, as lotsman moves an input."""
    return float(f"{x:.11e}")


def build_sensitivity():
    rows = []
    for (model, lot, p1, alpha, p2, beta), steps in SENSITIVITY:
        base = dict(model=model, lot_size=lot, p1=p1, alpha=alpha, p2=p2, beta=beta)
        moves = []
        for i, (name, sign) in enumerate((("aql", -1), ("alpha", 1), ("rql", 1), ("beta", 1))):
            for way, direction in (("conceded", sign), ("tightened", -sign)):
                point = [p1, alpha, p2, beta]
                point[i] = decimal(point[i] + direction * steps[i])
                q1, a, q2, b = point
                valid = q1 < q2 and 0 < a < 1 and 0 < b < 1 and a + b < 1 and \
                    (model == POI or q2 < 1)
                res = DesignProblem(model, q1, a, q2, b, lot).solve() if valid else dict(n=None)
                moves.append(dict(input=name, way=way, value=point[i], n=res["n"],
                                  c=res.get("c")))
        rows.append(dict(base=base, steps=list(steps), moves=moves))
    return rows


def build_fixture():
    grids = []
    for name, model, lot, alpha, beta, aqls, rqls, process in GRIDS:
        cells = []
        for p1 in aqls:
            for p2 in rqls:
                cell = dict(aql=p1, rql=p2, **solve_cell(model, p1, alpha, p2, beta, lot))
                if process is not None:
                    cell["ati"] = None if cell["n"] is None else \
                        mp_ati(model, cell["n"], cell["c"], process, lot)
                cells.append(cell)
        grids.append(dict(name=name, model=model, lot_size=lot, alpha=alpha, beta=beta,
                          aql=aqls, rql=rqls, process_quality=process, cells=cells))
    return {"grids": grids, "sensitivity": build_sensitivity()}


def bench():
    """The reference designer on every 5th row and column of the README's grid.

    lotsman's figure is for the full 100 x 100 grid of p1 0.2% to 2% and p2 3%
    to 12%; this times the same exhaustive search the fixture uses on 20 x 20
    of its cells (the full grid takes minutes) and prints the mean per design.
    """
    aqls, rqls = axis(0.002, 0.02, 100)[::5], axis(0.03, 0.12, 100)[::5]
    times = []
    for p1 in aqls:
        for p2 in rqls:
            t = time.perf_counter()
            DesignProblem(BIN, p1, 0.05, p2, 0.10).solve()
            times.append(time.perf_counter() - t)
    print(f"bench reference designer on {len(times)} cells of the 100 x 100 grid "
          f"(every 5th AQL and RQL): mean {statistics.mean(times) * 1e3:.2f} ms per design, "
          f"median {statistics.median(times) * 1e3:.2f} ms, "
          f"slowest {max(times) * 1e3:.1f} ms; the full grid would take about "
          f"{statistics.mean(times) * 1e4:.0f} s")


def main(argv=None):
    args = parse_args(argv, __doc__)
    if args.bench:
        bench()
        return 0
    if args.self_test:
        print("no self-test of its own: the designer's is make_reference.py --self-test")
        return 0
    return write_or_check(FIXTURE, render(build_fixture()), "make_tradeoff_reference.py",
                          args.check)


if __name__ == "__main__":
    sys.exit(main())
