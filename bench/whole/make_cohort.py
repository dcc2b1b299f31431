#!/usr/bin/python3
"""Writes the synthetic benchmark cohort of scripts/bench-whole.sh: N rows, 22 columns
(y, risk, x1..x20), the shape of bench/'s in-memory cohorts. SYNTHETIC, for timing only: never
a check value. The outcome follows logit p = -1.5 + sum_j b_j x_j with b_j = 0.3 (-1)^j / sqrt(j),
so a fitted model has 20 non-zero terms; `risk` is a deliberately miscalibrated score for
`validate --risk` (logit risk = 0.2 + 1.2 * true logit, plus noise).

    /usr/bin/python3 bench/whole/make_cohort.py N OUT.csv [--predictors K] [--missing J]

--predictors K keeps y, risk and the first K predictors (the 100k x 10 cohort of `internal`).
--missing J blanks values of x1..xJ (J <= K/2; the cohort of scripts/bench-impute.sh), missing at
random: x_j is blank with logit P = c_j + y + 0.5 x_(J+j), so its missingness depends on the
outcome and on a complete predictor, never on x_j itself; c_j spreads the shares from about 10%
(x1) to 30% (xJ). The blanks come from a second generator, so every written value, and the file
without --missing, is the same as without the option.
Fixed seed; written in blocks so 10^7 rows need little memory.
"""
import sys

import numpy as np
import pandas as pd

SEED = 20261204
BLOCK = 250_000


def option(args, name, default):
    if name not in args:
        return default
    i = args.index(name)
    value = int(args[i + 1])
    del args[i : i + 2]
    return value


def blank(frame, x, y, missing, rng):
    """Blanks x1..x<missing> in place (see the module's docstring)."""
    for j in range(missing):
        share = 0.2 if missing == 1 else 0.1 + 0.2 * j / (missing - 1)
        # offsets the outcome term (a fifth of patients have y = 1) and the driver's spread
        c = np.log(share / (1.0 - share)) - 0.25
        p = 1.0 / (1.0 + np.exp(-(c + y + 0.5 * x[:, missing + j])))
        frame.loc[rng.random(len(y)) < p, f"x{j + 1}"] = np.nan


def main() -> None:
    args = sys.argv[1:]
    predictors = option(args, "--predictors", 20)
    missing = option(args, "--missing", 0)
    if not 0 <= 2 * missing <= predictors:
        raise SystemExit("--missing J needs J <= predictors / 2 (each has a complete driver)")
    n, out = int(args[0]), args[1]
    rng = np.random.default_rng(SEED)
    holes = np.random.default_rng([SEED, 1])
    j = np.arange(1, 21)
    beta = 0.3 * (-1.0) ** j / np.sqrt(j)
    with open(out, "w", encoding="ascii") as f:
        f.write(",".join(["y", "risk"] + [f"x{k}" for k in range(1, predictors + 1)]) + "\n")
        done = 0
        while done < n:
            m = min(BLOCK, n - done)
            x = rng.standard_normal((m, 20))
            lp = -1.5 + x @ beta
            y = (rng.random(m) < 1.0 / (1.0 + np.exp(-lp))).astype(int)
            risk = 1.0 / (1.0 + np.exp(-(0.2 + 1.2 * lp + 0.3 * rng.standard_normal(m))))
            frame = pd.DataFrame({"y": y, "risk": np.round(risk, 6)})
            for k in range(predictors):
                frame[f"x{k + 1}"] = np.round(x[:, k], 4)
            if missing:
                blank(frame, x, y, missing, holes)
            frame.to_csv(f, header=False, index=False, lineterminator="\n")
            done += m


if __name__ == "__main__":
    main()
