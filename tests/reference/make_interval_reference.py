#!/usr/bin/env python3
"""Reference values for lotsman's process-average intervals: the
Clopper-Pearson interval of a fraction nonconforming and the exact Poisson
interval of nonconformities per unit, from scipy.stats alone.

Writes ``tests/data/interval_reference.json``; each row stores the scipy
calls that gave its limits beside the values.

Usage (from the repository root)::

    python3 tests/reference/make_interval_reference.py           # (re)write the fixture
    python3 tests/reference/make_interval_reference.py --check   # exit 1 if it would change

Conventions (mirrored by the Rust code): a = 1 - level; found = 0 gives the
lower limit 0; for the binomial, found = inspected gives the upper limit 1.
Binomial: lower = beta.ppf(a/2, x, n-x+1), upper = beta.isf(a/2, x+1, n-x)
(the upper tail through isf keeps its accuracy near 1).  Poisson, per unit:
lower = chi2.ppf(a/2, 2x)/2/u, upper = chi2.isf(a/2, 2x+2)/2/u.
"""

from __future__ import annotations

import sys
from pathlib import Path

import scipy.stats as st

sys.path.insert(0, str(Path(__file__).resolve().parent))
from make_reference import parse_args, render, write_or_check  # noqa: E402

REPO = Path(__file__).resolve().parents[2]
FIXTURE = REPO / "tests" / "data" / "interval_reference.json"

# (found, inspected, level): from a first sample with nothing found to a
# ledger's ten million units, both ends of the range, three levels.
BINOMIAL = [
    (0, 1, 0.95), (1, 1, 0.95), (0, 50, 0.95), (1, 50, 0.95), (2, 80, 0.95),
    (5, 125, 0.95), (50, 50, 0.95), (7, 13, 0.95), (3, 1000, 0.95),
    (10, 200, 0.95), (500, 1000, 0.95), (999, 1000, 0.95), (0, 1_000_000, 0.95),
    (1, 1_000_000, 0.95), (100, 10_000, 0.95), (1234, 10_000_000, 0.95),
    (2, 80, 0.99), (0, 20, 0.90), (40, 315, 0.90), (3, 500, 0.999),
]

# (found nonconformities, units, level).
POISSON = [
    (0, 1, 0.95), (0, 100, 0.95), (1, 100, 0.95), (5, 125, 0.95), (20, 50, 0.95),
    (1000, 2000, 0.95), (3, 1_000_000, 0.95), (12345, 10_000_000, 0.95),
    (2, 3, 0.99), (0, 500, 0.90), (150, 80, 0.95), (1, 1, 0.999),
]


def binomial_row(x, n, level):
    a = 1 - level
    if x == 0:
        lower, call_lower = 0.0, "0 (found = 0)"
    else:
        lower = float(st.beta.ppf(a / 2, x, n - x + 1))
        call_lower = f"scipy.stats.beta.ppf({a / 2!r}, {x}, {n - x + 1})"
    if x == n:
        upper, call_upper = 1.0, "1 (found = inspected)"
    else:
        upper = float(st.beta.isf(a / 2, x + 1, n - x))
        call_upper = f"scipy.stats.beta.isf({a / 2!r}, {x + 1}, {n - x})"
    return {"found": x, "inspected": n, "level": level, "lower": lower, "upper": upper,
            "call_lower": call_lower, "call_upper": call_upper}


def poisson_row(x, u, level):
    a = 1 - level
    if x == 0:
        lower, call_lower = 0.0, "0 (found = 0)"
    else:
        lower = float(st.chi2.ppf(a / 2, 2 * x)) / 2 / u
        call_lower = f"scipy.stats.chi2.ppf({a / 2!r}, {2 * x}) / 2 / {u}"
    upper = float(st.chi2.isf(a / 2, 2 * x + 2)) / 2 / u
    call_upper = f"scipy.stats.chi2.isf({a / 2!r}, {2 * x + 2}) / 2 / {u}"
    return {"found": x, "units": u, "level": level, "lower": lower, "upper": upper,
            "call_lower": call_lower, "call_upper": call_upper}


def main(argv=None):
    args = parse_args(argv, __doc__)
    fixture = {
        "source": "scipy.stats (beta.ppf, beta.isf, chi2.ppf, chi2.isf); make_interval_reference.py",
        "clopper_pearson": [binomial_row(*c) for c in BINOMIAL],
        "poisson": [poisson_row(*c) for c in POISSON],
    }
    return write_or_check(FIXTURE, render(fixture), "tests/reference/make_interval_reference.py",
                          args.check)


if __name__ == "__main__":
    sys.exit(main())
