#!/usr/bin/python3
"""The peer of scripts/bench-whole.sh: what a user would otherwise write with Debian's pandas,
numpy and scikit-learn, doing as much of each Calivera command's work as those libraries offer.
It is a timing peer only; its numbers are never check values.

    peer.py validate-risk DATA            (y, risk)
    peer.py validate-model DATA MODEL     (y, x1..x20 and a calivera-model/1 file's coefficients)
    peer.py fit DATA OUT                  (y on x1..x20, maximum likelihood, with standard errors)
    peer.py validate-bootstrap DATA B     (y, risk; B resamples)
    peer.py internal DATA B               (y on all x columns; B resamples with refit)
    peer.py impute DATA MODEL M K         (as validate-model, x columns with blanks; M copies)
    peer.py pool-stacked DATA MODEL COL   (as validate-model on copies stacked by COL, 0 = original)

Every workload hashes the file (SHA-256), reads it with pandas, and computes the AUC with its
DeLong standard error, calibration-in-the-large and slope (Newton-Raphson), the Brier score,
O/E, Hosmer-Lemeshow deciles and net benefit at 99 thresholds. It does NOT compute what these
libraries lack: the loess calibration curve and its ICI/E50/E90, the ROC curve thinning, Wilson
intervals per threshold, the sample-size checks and the JSON report; so the ratio favours the peer.

`impute` and `pool-stacked` (scripts/bench-impute.sh) validate the complete cases of the original
data, then every completed copy, and pool the c-statistic (logit), O/E (log), calibration
intercept and slope and Brier score by Rubin's rules, with the mean decision curve. `impute`
makes its copies with scikit-learn's IterativeImputer (Bayesian ridge, a posterior draw per
value, max_iter=K, random_state = copy number; the outcome and the model's columns as
predictors), its nearest substitute for predictive mean matching, which it lacks; skip_complete
spares it models of the complete columns, as Calivera does.
"""
import hashlib
import json
import sys

import numpy as np
import pandas as pd
from scipy.stats import rankdata
from sklearn.experimental import enable_iterative_imputer  # noqa: F401 (unlocks the import below)
from sklearn.impute import IterativeImputer
from sklearn.linear_model import LogisticRegression
from sklearn.metrics import brier_score_loss, roc_auc_score


def sha256(path):
    h = hashlib.sha256()
    with open(path, "rb") as f:
        for block in iter(lambda: f.read(1 << 20), b""):
            h.update(block)
    return h.hexdigest()


def delong_se(y, p):
    pos, neg = p[y == 1], p[y == 0]
    m, n = len(pos), len(neg)
    both = rankdata(np.concatenate([pos, neg]))
    v10 = (both[:m] - rankdata(pos)) / n
    v01 = 1.0 - (both[m:] - rankdata(neg)) / m
    return np.sqrt(v10.var(ddof=1) / m + v01.var(ddof=1) / n)


def newton(lp, y, slope):
    a, b = 0.0, 1.0
    for _ in range(30):
        mu = 1.0 / (1.0 + np.exp(-(a + b * lp)))
        r, w = y - mu, mu * (1.0 - mu)
        if slope:
            info = np.array([[w.sum(), (w * lp).sum()], [(w * lp).sum(), (w * lp * lp).sum()]])
            step = np.linalg.solve(info, np.array([r.sum(), (r * lp).sum()]))
        else:
            step = np.array([r.sum() / w.sum(), 0.0])
        a, b = a + step[0], b + step[1]
        if np.abs(step).max() < 1e-10:
            break
    return a, b


def measures(y, p, full=True):
    lp = np.log(p / (1.0 - p))
    out = {
        "auc": roc_auc_score(y, p),
        "intercept": newton(lp, y, False)[0],
        "slope": newton(lp, y, True)[1],
        "brier": brier_score_loss(y, p),
        "oe": y.mean() / p.mean(),
    }
    if full:
        out["auc_se"] = delong_se(y, p)
        order = np.argsort(p, kind="stable")
        groups = np.array_split(order, 10)
        out["hl"] = sum(
            (y[g].sum() - p[g].sum()) ** 2 / (p[g].sum() * (1 - p[g].mean())) for g in groups
        )
        t = np.arange(1, 100) / 100.0
        n = len(y)
        nb = []
        for threshold in t:
            flagged = p >= threshold
            tp = np.sum(flagged & (y == 1))
            fp = np.sum(flagged & (y == 0))
            nb.append(tp / n - fp / n * threshold / (1 - threshold))
        out["net_benefit"] = nb
    return out


def fit(x, y):
    model = LogisticRegression(penalty=None, solver="newton-cholesky", tol=1e-10, max_iter=100)
    model.fit(x, y)
    p = model.predict_proba(x)[:, 1]
    design = np.column_stack([np.ones(len(y)), x])
    information = design.T @ (design * (p * (1 - p))[:, None])
    se = np.sqrt(np.diag(np.linalg.inv(information)))
    return model, se


def load_model(path):
    with open(path, encoding="utf-8") as f:
        model = json.load(f)
    names = [t["variable"] for t in model["terms"]]
    beta = np.array([t["estimate"]["coefficient"] for t in model["terms"]])
    return names, model["intercept"]["coefficient"], beta


def risks(x, intercept, beta):
    return 1.0 / (1.0 + np.exp(-(intercept + x @ beta)))


def on_pooling_scale(y, p, m):
    """Each pooled measure of one copy on its pooling scale, with its complete-data variance."""
    lp = np.log(p / (1.0 - p))
    mu = 1.0 / (1.0 + np.exp(-(m["intercept"] + lp)))
    a, b = newton(lp, y, True)
    fitted = 1.0 / (1.0 + np.exp(-(a + b * lp)))
    w = fitted * (1.0 - fitted)
    info = np.array([[w.sum(), (w * lp).sum()], [(w * lp).sum(), (w * lp * lp).sum()]])
    auc = m["auc"]
    return {
        "logit_c_statistic": (np.log(auc / (1 - auc)), (m["auc_se"] / (auc * (1 - auc))) ** 2),
        "log_oe": (np.log(m["oe"]), 1.0 / y.sum()),
        "intercept": (m["intercept"], 1.0 / (mu * (1.0 - mu)).sum()),
        "slope": (b, np.linalg.inv(info)[1, 1]),
        "brier": (m["brier"], ((y - p) ** 2).var(ddof=1) / len(y)),
    }


def rubin(y, copies):
    """Validates every copy's risks and pools by Rubin's rules: mean, within + (1 + 1/m) between."""
    per_copy, curves = [], []
    for p in copies:
        m = measures(y, p)
        per_copy.append(on_pooling_scale(y, p, m))
        curves.append(m["net_benefit"])
    pooled = {"net_benefit": np.mean(curves, axis=0).tolist()}
    k = len(copies)
    for name in per_copy[0]:
        values = np.array([c[name][0] for c in per_copy])
        within = np.mean([c[name][1] for c in per_copy])
        pooled[f"pooled_{name}"] = values.mean()
        pooled[f"pooled_{name}_var"] = within + (1 + 1 / k) * values.var(ddof=1)
    return pooled


def complete_cases(y, x, intercept, beta):
    kept = ~np.isnan(x).any(axis=1)
    return measures(y[kept], risks(x[kept], intercept, beta))


def main():
    work, data = sys.argv[1], sys.argv[2]
    digest = sha256(data)
    if work == "validate-risk":
        frame = pd.read_csv(data, usecols=["y", "risk"])
        result = measures(frame["y"].to_numpy(float), frame["risk"].to_numpy())
    elif work == "validate-model":
        names, intercept, beta = load_model(sys.argv[3])
        frame = pd.read_csv(data, usecols=["y"] + names)
        p = risks(frame[names].to_numpy(), intercept, beta)
        result = measures(frame["y"].to_numpy(float), p)
    elif work == "fit":
        frame = pd.read_csv(data)
        names = [c for c in frame.columns if c.startswith("x")]
        model, se = fit(frame[names].to_numpy(), frame["y"].to_numpy())
        result = {"coef": model.coef_[0].tolist(), "intercept": float(model.intercept_[0]),
                  "se": se.tolist()}
        with open(sys.argv[3], "w", encoding="utf-8") as f:
            json.dump(result, f)
    elif work == "validate-bootstrap":
        frame = pd.read_csv(data, usecols=["y", "risk"])
        y, p = frame["y"].to_numpy(float), frame["risk"].to_numpy()
        result = measures(y, p)
        rng = np.random.default_rng(1)
        reps = []
        for _ in range(int(sys.argv[3])):
            i = rng.integers(0, len(y), len(y))
            reps.append(measures(y[i], p[i], full=False))
        result["ci"] = {k: np.percentile([r[k] for r in reps], [2.5, 97.5]).tolist() for k in reps[0]}
    elif work == "internal":
        frame = pd.read_csv(data)
        names = [c for c in frame.columns if c.startswith("x")]
        x, y = frame[names].to_numpy(), frame["y"].to_numpy(float)
        model, _ = fit(x, y)
        apparent = measures(y, model.predict_proba(x)[:, 1], full=False)
        rng = np.random.default_rng(1)
        optimism = {k: 0.0 for k in apparent}
        b = int(sys.argv[3])
        for _ in range(b):
            i = rng.integers(0, len(y), len(y))
            refit, _ = fit(x[i], y[i])
            boot = measures(y[i], refit.predict_proba(x[i])[:, 1], full=False)
            test = measures(y, refit.predict_proba(x)[:, 1], full=False)
            for k in optimism:
                optimism[k] += (boot[k] - test[k]) / b
        result = {k: apparent[k] - optimism[k] for k in apparent}
    elif work == "impute":
        names, intercept, beta = load_model(sys.argv[3])
        frame = pd.read_csv(data, usecols=["y"] + names)
        y, x = frame["y"].to_numpy(float), frame[names].to_numpy()
        result = complete_cases(y, x, intercept, beta)
        copies = []
        for r in range(int(sys.argv[4])):
            imputer = IterativeImputer(sample_posterior=True, max_iter=int(sys.argv[5]),
                                       random_state=r, skip_complete=True)
            filled = imputer.fit_transform(np.column_stack([y, x]))[:, 1:]
            copies.append(risks(filled, intercept, beta))
        result.update(rubin(y, copies))
    elif work == "pool-stacked":
        names, intercept, beta = load_model(sys.argv[3])
        index = sys.argv[4]
        frame = pd.read_csv(data, usecols=[index, "y"] + names)
        stacked = dict(tuple(frame.groupby(index, sort=True)))
        original = stacked.pop(0)
        y = original["y"].to_numpy(float)
        result = complete_cases(y, original[names].to_numpy(), intercept, beta)
        copies = [risks(c[names].to_numpy(), intercept, beta) for c in stacked.values()]
        result.update(rubin(y, copies))
    else:
        raise SystemExit(f"unknown workload {work}")
    print(digest[:12], json.dumps({k: v for k, v in result.items() if np.isscalar(v)}))


if __name__ == "__main__":
    main()
