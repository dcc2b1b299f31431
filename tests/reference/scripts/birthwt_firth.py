#!/usr/bin/python3
"""Reference values for Firth's penalized likelihood (Firth, Biometrika 1993): the maximum of
log L(beta) + 1/2 log det I(beta) found by a general-purpose optimiser (scipy BFGS, then scipy's
Nelder-Mead polish), independent of Calivera's modified-score Newton iteration. Data: the
birthwt model low ~ age + lwt + race + ftv (tests/reference/data/birthwt.csv, from MASS).
SEs: square roots of the diagonal of I(beta)^-1 at the penalized estimate.

Run from the repository root:  /usr/bin/python3 tests/reference/scripts/birthwt_firth.py
"""
import csv

import numpy as np
import scipy
from scipy.optimize import minimize

with open("tests/reference/data/birthwt.csv") as f:
    rows = list(csv.DictReader(f))
y = np.array([float(r["low"]) for r in rows])
X = np.column_stack([
    np.ones(len(rows)),
    [float(r["age"]) for r in rows],
    [float(r["lwt"]) for r in rows],
    [r["race"] == "black" for r in rows],
    [r["race"] == "other" for r in rows],
    [float(r["ftv"]) for r in rows],
]).astype(float)


def information(beta):
    mu = 1 / (1 + np.exp(-X @ beta))
    return X.T @ (X * (mu * (1 - mu))[:, None])


def negative_penalized(beta):
    eta = X @ beta
    loglik = np.sum(y * eta - np.logaddexp(0, eta))
    return -(loglik + 0.5 * np.linalg.slogdet(information(beta))[1])


start = np.zeros(X.shape[1])
fit = minimize(negative_penalized, start, method="BFGS", options={"gtol": 1e-11, "maxiter": 10000})
polish = minimize(negative_penalized, fit.x, method="Nelder-Mead",
                  options={"xatol": 1e-12, "fatol": 1e-15, "maxiter": 200000, "maxfev": 200000})
beta = polish.x if polish.fun <= fit.fun else fit.x
se = np.sqrt(np.diag(np.linalg.inv(information(beta))))
names = ["(Intercept)", "age", "lwt", "raceblack", "raceother", "ftv"]
with open("tests/reference/data/birthwt_firth.csv", "w") as f:
    f.write("# Firth penalized likelihood maximised by scipy %s BFGS + Nelder-Mead, numpy %s; "
            "written by tests/reference/scripts/birthwt_firth.py\n"
            % (scipy.__version__, np.__version__))
    f.write("term,value,se\n")
    for n, b, s in zip(names, beta, se):
        f.write("%s,%.17g,%.17g\n" % (n, b, s))
    f.write("penalized_loglik,%.17g,\n" % -negative_penalized(beta))
