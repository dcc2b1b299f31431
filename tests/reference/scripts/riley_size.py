#!/usr/bin/python3
"""Reference values for Riley et al., Stat Med 2021;40:4230-51 (minimum sample size for external
validation, binary outcome), computed independently of Calivera with scipy quadrature.

Published check (read): outcome proportion phi = 0.018 needs 9835 participants (177 events),
driven by the calibration-slope criterion (target CI width 0.2).
The paper's LP distribution is not restated here; for a normal LP whose mean is fixed by phi,
the SD that reproduces n = 9835 is found by inversion (computed; the smaller of the two roots).
Slope criterion (memory of the paper, recomputed from the Fisher information of logit p = a + b LP
at a = 0, b = 1): n = I_aa / (SE^2 (I_aa I_bb - I_ab^2)).
C criterion (memory): Newcombe's SE, solved for n. O/E criterion (read): n = (1-phi)/(phi SE^2).
Run: /usr/bin/python3 tests/reference/scripts/riley_size.py > tests/reference/data/riley_size.json
"""
import json
import math

from scipy import integrate, optimize, stats

Z = stats.norm.ppf(0.975)


def expit(x):
    return 1.0 / (1.0 + math.exp(-x))


def expect(mean, sd, f):
    g = lambda z: stats.norm.pdf(z) * f(mean + sd * z)
    return integrate.quad(g, -12, 12, limit=400, epsabs=1e-14, epsrel=1e-12)[0]


def mean_for(phi, sd):
    return optimize.brentq(lambda m: expect(m, sd, expit) - phi, -40, 40, xtol=1e-13)


def slope_n(mean, sd, se):
    v = lambda lp: expit(lp) * (1 - expit(lp))
    a = expect(mean, sd, v)
    b = expect(mean, sd, lambda lp: lp * v(lp))
    c = expect(mean, sd, lambda lp: lp * lp * v(lp))
    return a / (se * se * (a * c - b * b))


def newcombe_se(c, phi, n):
    h = n / 2 - 1
    return math.sqrt(c * (1 - c) * (1 + h * (1 - c) / (2 - c) + h * c / (1 + c)) /
                     (n * n * phi * (1 - phi)))


phi = 0.018
se_slope = 0.2 / (2 * Z)
sd = optimize.brentq(lambda s: slope_n(mean_for(phi, s), s, se_slope) - 9835, 1.5, 2.5, xtol=1e-10)
sd_rounded = 2.2
mean22 = mean_for(phi, sd_rounded)
se_oe = math.asinh(0.1) / Z
out = {
    "source": "tests/reference/scripts/riley_size.py (scipy quadrature)",
    "phi": phi,
    "slope_se_target": se_slope,
    "lp_sd_reproducing_9835": sd,
    "lp_sd": sd_rounded,
    "lp_mean_for_phi": mean22,
    "slope_n_at_sd_2_2": slope_n(mean22, sd_rounded, se_slope),
    "oe_se_target": se_oe,
    "oe_n": (1 - phi) / (phi * se_oe ** 2),
    "c_0_8_n_width_0_1": optimize.brentq(
        lambda n: newcombe_se(0.8, phi, n) - 0.1 / (2 * Z), 10, 1e8, xtol=1e-6),
}
print(json.dumps(out, indent=2))
