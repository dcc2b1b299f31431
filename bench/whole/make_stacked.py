#!/usr/bin/python3
"""Writes the stacked cohort of scripts/bench-impute.sh for `validate --imputation-column
imputation`: the rows of a cohort with blanks (make_cohort.py --missing) M + 1 times behind an
index column, 0 for the original with its blanks, 1..M for completed copies of the same patients
in the same order. SYNTHETIC, for timing the pooling only: a copy fills each blank with a value
drawn at random from the column's observed ones (fixed seed per copy), which makes it complete
but is no imputation model; its results are never check values.

    /usr/bin/python3 bench/whole/make_stacked.py COHORT.csv M OUT.csv

Values are copied as text, so copy 0 holds the cohort's lines unchanged.
"""
import sys

import numpy as np
import pandas as pd

SEED = 20261205


def main() -> None:
    cohort, copies, out = sys.argv[1], int(sys.argv[2]), sys.argv[3]
    original = pd.read_csv(cohort, dtype=str, keep_default_na=False)
    blanks = {c: (original[c] == "").to_numpy() for c in original.columns}
    blanks = {c: b for c, b in blanks.items() if b.any()}
    with open(out, "w", encoding="ascii") as f:
        f.write(",".join(["imputation"] + list(original.columns)) + "\n")
        for k in range(copies + 1):
            copy = original.copy()
            if k > 0:
                rng = np.random.default_rng([SEED, k])
                for column, blank in blanks.items():
                    observed = original[column].to_numpy()[~blank]
                    copy.loc[blank, column] = rng.choice(observed, blank.sum())
            copy.insert(0, "imputation", k)
            copy.to_csv(f, header=False, index=False, lineterminator="\n")


if __name__ == "__main__":
    main()
