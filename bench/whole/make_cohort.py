#!/usr/bin/python3
"""Writes the synthetic benchmark cohort of scripts/bench-whole.sh: N rows, 22 columns
(y, risk, x1..x20), the shape of bench/'s in-memory cohorts. SYNTHETIC, for timing only: never
a check value. The outcome follows logit p = -1.5 + sum_j b_j x_j with b_j = 0.3 (-1)^j / sqrt(j),
so a fitted model has 20 non-zero terms; `risk` is a deliberately miscalibrated score for
`validate --risk` (logit risk = 0.2 + 1.2 * true logit, plus noise).

    /usr/bin/python3 bench/whole/make_cohort.py N OUT.csv [--predictors K]

--predictors K keeps y, risk and the first K predictors (the 100k x 10 cohort of `internal`).
Fixed seed; written in blocks so 10^7 rows need little memory.
"""
import sys

import numpy as np
import pandas as pd

SEED = 20261204
BLOCK = 250_000


def main() -> None:
    args = sys.argv[1:]
    predictors = 20
    if "--predictors" in args:
        i = args.index("--predictors")
        predictors = int(args[i + 1])
        del args[i : i + 2]
    n, out = int(args[0]), args[1]
    rng = np.random.default_rng(SEED)
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
            frame.to_csv(f, header=False, index=False, lineterminator="\n")
            done += m


if __name__ == "__main__":
    main()
