#!/usr/bin/python3
"""Generates Calivera's demo data (sample_data/). Everything here is SYNTHETIC: an invented
hospital network, invented patients, an invented published model. It is demo material only and
never a check value for a test.

Scenario: the Kestrel Bay Health Alliance (fictional, four hospitals) wants to validate the
"Ashcombe 30-day Complication Score" (fictional), a logistic model said to have been published by
the (fictional) Ashcombe University Hospital for any post-operative complication within 30 days
of surgery. The score was developed on 3,000 Ashcombe patients (development_cohort.csv); Kestrel
Bay has 12,000 patients of its own (local_cohort.csv). On the local cohort the score
over-predicts and is too extreme: the local outcomes follow logit p = -0.7 + 0.8 * LP, LP the
published linear predictor, so calibration-in-the-large is negative and the slope is about 0.8.

Run with Debian's python and numpy from the repository root:
    /usr/bin/python3 scripts/generate_sample_data.py
Fixed seed: the files are reproducible byte for byte.
"""
import numpy as np

SEED = 20261201
rng = np.random.default_rng(SEED)

RESERVE = ["robust", "reduced", "limited", "poor"]  # physiological reserve band (invented)
URGENCY = ["elective", "expedited", "emergency"]
SPLINE_KNOTS = [19.5, 24.5, 29.0, 36.5]  # BMI, kg/m2


def rcs(x, knots, j):
    """Harrell's restricted cubic spline basis j >= 1, divided by (t_k - t_1)^2 (as Calivera)."""
    t, k = knots, len(knots)
    cube = lambda v: np.where(v > 0, v, 0.0) ** 3
    b = (cube(x - t[j - 1]) - cube(x - t[k - 2]) * (t[k - 1] - t[j - 1]) / (t[k - 1] - t[k - 2])
         + cube(x - t[k - 1]) * (t[k - 2] - t[j - 1]) / (t[k - 1] - t[k - 2]))
    return b / (t[k - 1] - t[0]) ** 2


def patients(n, older, emergency_share, sites):
    age = np.clip(rng.normal(61 + older, 15, n), 18, 96).round()
    sex = rng.choice(["female", "male"], n)
    # Reserve worsens with age.
    score = (age - 60) / 15 + rng.normal(0, 1, n)
    reserve = np.array(RESERVE)[np.digitize(score, [-0.3, 0.9, 1.9])]
    bmi = np.clip(rng.lognormal(np.log(27), 0.17, n), 15, 55).round(1)
    creat = np.clip(rng.lognormal(np.log(78) + 0.004 * (age - 60), 0.3, n)
                    * np.where(sex == "male", 1.12, 1.0), 30, 900).round()
    urgency = rng.choice(URGENCY, n, p=[0.80 - emergency_share, 0.20, emergency_share])
    site = rng.choice(sites, n)
    return dict(age=age, sex=sex, reserve=reserve, bmi=bmi, creat=creat, urgency=urgency,
                site=site)


def design(d):
    """Columns of the published model, in its term order."""
    age10 = (d["age"] - 60) / 10
    emergency = (d["urgency"] == "emergency").astype(float)
    return np.column_stack([
        age10, np.log(d["creat"]), d["bmi"], rcs(d["bmi"], SPLINE_KNOTS, 1),
        rcs(d["bmi"], SPLINE_KNOTS, 2),
        (d["reserve"] == "reduced"), (d["reserve"] == "limited"), (d["reserve"] == "poor"),
        (d["urgency"] == "expedited"), emergency, (d["sex"] == "male"), age10 * emergency,
    ]).astype(float)


def true_lp(d):
    """The invented truth behind the development data (BMI effect U-shaped)."""
    age10 = (d["age"] - 60) / 10
    emergency = d["urgency"] == "emergency"
    return (-5.75 + 0.28 * age10 + 0.62 * np.log(d["creat"]) + 0.004 * (d["bmi"] - 26) ** 2
            + np.select([d["reserve"] == r for r in RESERVE], [0, 0.35, 0.8, 1.4])
            + np.select([d["urgency"] == u for u in URGENCY], [0, 0.4, 0.95])
            + 0.2 * (d["sex"] == "male") - 0.12 * age10 * emergency)


def fit_logistic(X, y):
    """Plain Newton-Raphson; returns coefficients and SEs (intercept first)."""
    X = np.column_stack([np.ones(len(y)), X])
    beta = np.zeros(X.shape[1])
    for _ in range(50):
        mu = 1 / (1 + np.exp(-X @ beta))
        info = X.T @ (X * (mu * (1 - mu))[:, None])
        step = np.linalg.solve(info, X.T @ (y - mu))
        beta += step
        if np.max(np.abs(step)) < 1e-10:
            break
    return beta, np.sqrt(np.diag(np.linalg.inv(info)))


def with_missing(values, share, token):
    out = values.astype(object)
    out[rng.random(len(values)) < share] = token
    return out


def write_csv(path, header, columns):
    with open(path, "w") as f:
        f.write(",".join(header) + "\n")
        for row in zip(*columns):
            f.write(",".join(fmt(v) for v in row) + "\n")


def fmt(v):
    if isinstance(v, (float, np.floating)):
        return repr(float(v)).removesuffix(".0")
    return str(v)


# Development cohort: Ashcombe University Hospital (fictional), 3,000 patients. The published
# fit used the complete data; the file we ship has 2% of BMI values missing, so refitting it with
# `calivera fit` also shows the exclusion report.
dev = patients(3000, 0, 0.10, ["Ashcombe"])
dev_y = (rng.random(3000) < 1 / (1 + np.exp(-true_lp(dev)))).astype(int)
beta, se = fit_logistic(design(dev), dev_y)
# The "publication" prints three decimals; the model file keeps what was printed.
beta, se = beta.round(3), se.round(3)
dev_ids = rng.choice(np.arange(100000, 999999), 3000, replace=False)
write_csv("sample_data/development_cohort.csv",
          ["record_id", "age", "sex", "reserve", "bmi", "creatinine", "urgency",
           "complication_30d"],
          [["ASH-%d" % i for i in dev_ids], dev["age"], dev["sex"], dev["reserve"],
           with_missing(dev["bmi"], 0.02, "NA"), dev["creat"], dev["urgency"], dev_y])

# Local cohort: Kestrel Bay Health Alliance (fictional), 12,000 patients, four sites, older and
# with more emergencies; outcomes miscalibrated against the published score.
sites = ["Kestrel Bay General", "Marrow Point", "Linden Ford", "Saltmarsh Community"]
loc = patients(12000, 3, 0.16, sites)
lp_published = beta[0] + design(loc) @ beta[1:]
loc_y = (rng.random(12000) < 1 / (1 + np.exp(-(-0.7 + 0.8 * lp_published)))).astype(int)
loc_ids = rng.choice(np.arange(1000000, 9999999), 12000, replace=False)
write_csv("sample_data/local_cohort.csv",
          ["patient_ref", "site", "age", "sex", "reserve", "bmi", "creat_umol", "urgency",
           "complication_30d"],
          [["KB%d" % i for i in loc_ids], loc["site"], loc["age"], loc["sex"],
           with_missing(loc["reserve"], 0.01, "NA"), with_missing(loc["bmi"], 0.03, "NA"),
           with_missing(loc["creat"], 0.02, ""), loc["urgency"], loc_y])

names = ["age per 10 years above 60", "log creatinine", "bmi spline 0", "bmi spline 1",
         "bmi spline 2", "reserve=reduced", "reserve=limited", "reserve=poor",
         "urgency=expedited", "urgency=emergency", "sex=male", "age x emergency"]
est = {n: '{"coefficient": %s, "se": %s}' % (fmt(b), fmt(s))
       for n, b, s in zip(["(intercept)"] + names, beta, se)}
knots = "[" + ", ".join(fmt(k) for k in SPLINE_KNOTS) + "]"
text = f'''// SYNTHETIC demo model: the "Ashcombe 30-day Complication Score" and everything about it are
// invented for Calivera's sample data (scripts/generate_sample_data.py). Not a clinical model.
//
// A Calivera model file is JSON; // and /* */ comments like these are allowed.
{{
  "format": "calivera-model/1",            // format id, required
  "name": "Ashcombe 30-day Complication Score (fictional)",
  "outcome": "any post-operative complication within 30 days",
  "intercept": {est["(intercept)"]},  // estimate: coefficient, optional se
  "terms": [
    // linear: (x - center) / scale, here per 10 years above 60
    {{"name": "{names[0]}", "variable": "age", "unit": "years",
     "transform": "linear", "center": 60, "scale": 10,
     "estimate": {est[names[0]]}}},
    // log: natural log, the value must be > 0
    {{"name": "{names[1]}", "variable": "creatinine", "unit": "umol/L",
     "transform": "log", "estimate": {est[names[1]]}}},
    // spline: restricted cubic spline (Harrell); basis 0 is x itself, basis j = 1..k-2 the
    // j-th cubic part; "scaling" "knot-range-squared" (the default) divides the cubic parts by
    // (t_k - t_1)^2, "none" leaves them undivided
    {{"name": "{names[2]}", "variable": "bmi", "unit": "kg/m2", "transform": "spline",
     "knots": {knots}, "basis": 0, "estimate": {est[names[2]]}}},
    {{"name": "{names[3]}", "variable": "bmi", "unit": "kg/m2", "transform": "spline",
     "knots": {knots}, "basis": 1, "scaling": "knot-range-squared",
     "estimate": {est[names[3]]}}},
    {{"name": "{names[4]}", "variable": "bmi", "unit": "kg/m2", "transform": "spline",
     "knots": {knots}, "basis": 2, "estimate": {est[names[4]]}}},
    // indicator: 1 when the value equals "level" (text, or a number on a numeric column)
    {{"name": "{names[5]}", "variable": "reserve", "transform": "indicator",
     "level": "reduced", "estimate": {est[names[5]]}}},
    {{"name": "{names[6]}", "variable": "reserve", "transform": "indicator",
     "level": "limited", "estimate": {est[names[6]]}}},
    {{"name": "{names[7]}", "variable": "reserve", "transform": "indicator",
     "level": "poor", "estimate": {est[names[7]]}}},
    {{"name": "{names[8]}", "variable": "urgency", "transform": "indicator",
     "level": "expedited", "estimate": {est[names[8]]}}},
    {{"name": "{names[9]}", "variable": "urgency", "transform": "indicator",
     "level": "emergency", "estimate": {est[names[9]]}}},
    {{"name": "{names[10]}", "variable": "sex", "transform": "indicator", "level": "male",
     "estimate": {est[names[10]]}}},
    // product: an interaction, the product of two factors (each a variable + transform)
    {{"name": "{names[11]}", "transform": "product",
     "factors": [{{"variable": "age", "transform": "linear", "center": 60, "scale": 10}},
                 {{"variable": "urgency", "transform": "indicator", "level": "emergency"}}],
     "estimate": {est[names[11]]}}}
  ],
  // where the model came from (all optional)
  "development": {{
    "n": 3000, "events": {int(dev_y.sum())},
    "method": "maximum likelihood",
    "description": "fictional: Ashcombe University Hospital, elective and emergency surgery"
  }},
  // model variable -> local column, added by Kestrel Bay's analysts: their cohort calls
  // creatinine "creat_umol"
  "column_mapping": {{"creatinine": "creat_umol"}},
  // the level of each categorical variable that no indicator term names (scored 0); any other
  // level in a cohort is then an error instead of being scored as this one
  "reference_levels": {{"reserve": "robust", "urgency": "elective", "sex": "female"}}
}}
'''
with open("sample_data/published_model.json", "w") as f:
    f.write(text)

# Printed for the README (synthetic, demo only).
p_loc = 1 / (1 + np.exp(-lp_published))
print("development events %d / 3000; local events %d / 12000, mean published risk %.4f, O/E %.3f"
      % (dev_y.sum(), loc_y.sum(), p_loc.mean(), loc_y.sum() / p_loc.sum()))
