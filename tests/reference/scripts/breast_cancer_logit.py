#!/usr/bin/python3
"""Reference values for the logistic fitter: statsmodels Logit on the Wisconsin diagnostic
breast-cancer data (n = 569) as bundled with scikit-learn (Debian python3-sklearn,
/usr/lib/python3/dist-packages/sklearn/datasets/data/breast_cancer.csv; data from the UCI
Machine Learning Repository, Wolberg, Street & Mangasarian, CC BY 4.0).

Run from the repository root with Debian's python:  /usr/bin/python3 tests/reference/scripts/breast_cancer_logit.py
Writes tests/reference/data/breast_cancer.csv (five columns with a header; outcome malignant = 1)
and tests/reference/data/breast_cancer_logit.csv.
"""
import csv

import numpy as np
import sklearn
import statsmodels
import statsmodels.api as sm

SOURCE = "/usr/lib/python3/dist-packages/sklearn/datasets/data/breast_cancer.csv"
# Column positions in the sklearn file (its first line is "569,30,malignant,benign": row count,
# feature count and the two class names; then 30 features and the class, 0 = malignant).
FEATURES = {"mean_radius": 0, "mean_texture": 1, "mean_smoothness": 4, "mean_symmetry": 8}

with open(SOURCE) as f:
    header = next(csv.reader(f))
    rows = [list(map(float, r)) for r in csv.reader(f)]
assert header[:2] == ["569", "30"] and len(rows) == 569
data = np.array(rows)
malignant = (data[:, 30] == 0).astype(float)

with open("tests/reference/data/breast_cancer.csv", "w", newline="") as f:
    w = csv.writer(f, lineterminator="\n")
    w.writerow(["malignant"] + list(FEATURES))
    for i in range(len(rows)):
        w.writerow([int(malignant[i])] + [repr(data[i, c]) for c in FEATURES.values()])

X = sm.add_constant(np.column_stack([data[:, c] for c in FEATURES.values()]))
fit = sm.Logit(malignant, X).fit(method="newton", maxiter=100, tol=1e-10, disp=False)
assert fit.mle_retvals["converged"]
names = ["(Intercept)"] + list(FEATURES)
with open("tests/reference/data/breast_cancer_logit.csv", "w", newline="") as f:
    f.write("# statsmodels %s Logit (newton, tol 1e-10, converged), numpy %s, scikit-learn %s; "
            "written by tests/reference/scripts/breast_cancer_logit.py\n"
            % (statsmodels.__version__, np.__version__, sklearn.__version__))
    w = csv.writer(f, lineterminator="\n")
    w.writerow(["term", "value", "se"])
    for name, b, s in zip(names, fit.params, fit.bse):
        w.writerow([name, "%.17g" % b, "%.17g" % s])
    w.writerow(["deviance", "%.17g" % (-2 * fit.llf), ""])
    w.writerow(["null_deviance", "%.17g" % (-2 * fit.llnull), ""])
