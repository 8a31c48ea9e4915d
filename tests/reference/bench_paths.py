#!/usr/bin/env python3
"""Time issue 19's slow paths in the reference scripts' own code.

docs/performance.md puts lotsman's figures for these paths beside the same
work done by the reference scripts in this directory (scipy, numpy and
mpmath; nothing from any acceptance-sampling package). This script runs
that work and prints one line per path; it writes nothing.

Usage (from the repository root)::

    python3 tests/reference/bench_paths.py            # every path, a few minutes
    python3 tests/reference/bench_paths.py hyper      # paths whose name holds "hyper"

Where a reference search would take hours, the script times the first
blocks of its search and multiplies by the number of blocks; such lines say
"extrapolated" and from how much.
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
import make_reference as ref  # noqa: E402
import make_staged_reference as staged  # noqa: E402
import make_variables_reference as variables  # noqa: E402
from make_reference import BIN, HYP  # noqa: E402

#: A double search estimated beyond this many seconds is extrapolated from
#: its first blocks instead of run to the end.
RUN_LIMIT = 60.0
#: Blocks timed for an extrapolation.
SAMPLE_BLOCKS = 3


def median_time(fn, repeats):
    """Median wall time of ``repeats`` calls, and the last result."""
    times, out = [], None
    for _ in range(repeats):
        start = time.perf_counter()
        out = fn()
        times.append(time.perf_counter() - start)
    return statistics.median(times), out


def hyper_close():
    """Exact single design, hypergeometric, lot 10^6, 1.2%/1.25%."""
    # The scan over c stops at C_CAP = 2000 in the fixture script; the plan
    # here has c = 3594.
    ref.C_CAP = 5000
    secs, res = median_time(
        lambda: ref.DesignProblem(HYP, 0.012, 0.05, 0.0125, 0.10, 10**6).solve(), 3)
    return (f"{secs:.2f} s (make_reference.DesignProblem.solve, median of 3; "
            f"n = {res['n']}, c = {res['c']})")


def typical():
    """Exact single design, binomial, 1%/6%: the unit of issue 19's ratios."""
    secs, res = median_time(
        lambda: ref.DesignProblem(BIN, 0.01, 0.05, 0.06, 0.10).solve(), 50)
    return (f"{secs * 1e3:.2f} ms (make_reference.DesignProblem.solve, median of 50; "
            f"n = {res['n']}, c = {res['c']})")


def item_by_item():
    """OC and ASN of the 0.1%/0.3% item-by-item plan at 1,001 qualities."""
    # lotsman's plan for 0.1%/0.3%: Wald's lines at the nominal risks its
    # truncation search settled on (0.0475 and 0.095), closed at item 5,936
    # with acceptance number 10; the same 5,936 stages item by item.
    lines = staged.wald_lines(BIN, 0.001, 0.0475, 0.003, 0.095)
    stages = staged.sequential_stages(lines, 5936, 10)
    qualities = [0.0001 + 0.0099 * i / 1000 for i in range(1001)]
    sample = qualities[::250]
    start = time.perf_counter()
    for p in sample:
        staged.f64_stage_dp(BIN, stages, p)
    f64 = (time.perf_counter() - start) / len(sample)
    start = time.perf_counter()
    staged.mp_item_dp(BIN, stages, qualities[500])
    mp50 = time.perf_counter() - start
    return (f"{f64 * 1001:.0f} s extrapolated (f64_stage_dp, {f64:.2f} s a quality over "
            f"{len(sample)} qualities, times 1,001); at 50 digits (mp_item_dp) "
            f"{mp50:.1f} s a quality")


def double_search(p1, p2):
    """The exhaustive double search of make_staged_reference, asn-aql.

    Returns (seconds, extrapolated?, blocks): run to the end when the first
    blocks say it ends within RUN_LIMIT, else the first blocks' time scaled
    to every block.
    """
    start = time.perf_counter()
    search = staged.DoubleSearch(BIN, p1, 0.05, p2, 0.10, None, "asn-aql", None, [])
    setup = time.perf_counter() - start
    blocks = search._blocks()
    start = time.perf_counter()
    for _ in range(SAMPLE_BLOCKS):
        next(blocks)
    per_block = (time.perf_counter() - start) / SAMPLE_BLOCKS
    estimate = setup + per_block * len(search.triples)
    if estimate > RUN_LIMIT:
        return estimate, True, len(search.triples)
    start = time.perf_counter()
    staged.DoubleSearch(BIN, p1, 0.05, p2, 0.10, None, "asn-aql", None, []).run()
    return time.perf_counter() - start, False, len(search.triples)


def describe(secs, extrapolated, blocks):
    if extrapolated:
        return f"{secs:.0f} s extrapolated from {SAMPLE_BLOCKS} of {blocks} blocks"
    return f"{secs:.2f} s"


def double_close():
    """Double designer, 0.1%/0.3%; and 2%/10% for a case both finish."""
    far = double_search(0.02, 0.10)
    close = double_search(0.001, 0.003)
    return (f"0.1%/0.3%: {describe(*close)}; 2%/10%: {describe(*far)} "
            f"(make_staged_reference.DoubleSearch, asn-aql)")


def double_grid():
    """The 10 x 10 grid of double plans, AQL 0.5%..2%, RQL 3%..12%."""
    total, extrapolated, cells = 0.0, 0, 0
    for i in range(10):
        for j in range(10):
            p1 = 0.005 + 0.015 * i / 9
            p2 = 0.03 + 0.09 * j / 9
            secs, ext, _ = double_search(p1, p2)
            total += secs
            extrapolated += ext
            cells += 1
    return (f"{total:.0f} s over {cells} cells ({extrapolated} of them extrapolated "
            f"from {SAMPLE_BLOCKS} blocks; make_staged_reference.DoubleSearch per cell)")


def variables_two():
    """Two-limit variables design, sigma unknown, 1%/6%."""
    notes = []

    def run():
        scan = variables.OneSidedScan(0.01, 0.05, 0.06, 0.10, notes)
        return variables.design_unknown_two(0.01, 0.05, 0.06, 0.10, notes, scan)

    secs, res = median_time(run, 3)
    return f"{secs:.2f} s (make_variables_reference.design_unknown_two, median of 3; n = {res[0]})"


PATHS = [
    ("typical design 1%/6%", typical),
    ("hypergeometric design 1.2%/1.25%, lot 10^6", hyper_close),
    ("item-by-item 0.1%/0.3% at 1,001 qualities", item_by_item),
    ("double designer", double_close),
    ("two-limit variables, sigma unknown, 1%/6%", variables_two),
    ("10 x 10 double grid", double_grid),
]


def main(argv):
    wanted = argv[1:]
    for name, fn in PATHS:
        if wanted and not any(w in name for w in wanted):
            continue
        print(f"{name}: {fn()}", flush=True)


if __name__ == "__main__":
    main(sys.argv)
