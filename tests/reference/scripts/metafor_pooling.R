# Random-effects pooling reference for core/sites/random_effects.h, from R's general-purpose
# meta-analysis package metafor (Debian r-cran-metafor 3.8-1 with its datasets package metadat).
# Two published meta-analyses shipped with it:
#   bcg:       dat.bcg, 13 trials of BCG vaccine (Colditz et al., JAMA 1994), log risk ratios from
#              escalc(measure = "RR"); strong heterogeneity.
#   hackshaw:  dat.hackshaw1998, 37 studies of passive smoking and lung cancer (Hackshaw et al., BMJ
#              1997), log odds ratios as given; little heterogeneity, so the HKSJ scale factor q is
#              below 1 and the never-narrower rule changes the interval.
# For each: REML tau^2 (convergence threshold tightened), Wald, HKSJ ("knha") and truncated HKSJ
# ("adhoc") intervals, I^2, Q, the fixed-effect estimate, and the prediction interval of Riley,
# Higgins & Deeks (BMJ 2011) computed from metafor's estimates: t on k - 2 df, sqrt(tau^2 + SE^2).
# Run from the repository root:
#   Rscript tests/reference/scripts/metafor_pooling.R > tests/reference/data/metafor_pooling.json
suppressMessages(library(metafor))
num <- function(x) formatC(x, digits = 17, format = "g")
vec <- function(x) paste0("[", paste(num(x), collapse = ", "), "]")
sets <- list(
  bcg = escalc(measure = "RR", ai = tpos, bi = tneg, ci = cpos, di = cneg, data = dat.bcg),
  hackshaw = dat.hackshaw1998)
ctl <- list(threshold = 1e-14, maxiter = 10000)
cat("{\n  \"source\": \"tests/reference/scripts/metafor_pooling.R (R, metafor 3.8-1)\",\n")
for (j in seq_along(sets)) {
  d <- sets[[j]]
  k <- nrow(d)
  plain <- rma(d$yi, d$vi, method = "REML", control = ctl)
  knha <- rma(d$yi, d$vi, method = "REML", test = "knha", control = ctl)
  adhoc <- rma(d$yi, d$vi, method = "REML", test = "adhoc", control = ctl)
  fe <- rma(d$yi, d$vi, method = "FE")
  half <- qt(0.975, k - 2) * sqrt(plain$tau2 + plain$se^2)
  cat("  \"", names(sets)[j], "\": {\"yi\": ", vec(c(d$yi)), ", \"vi\": ", vec(c(d$vi)),
      ", \"estimate\": ", num(c(plain$b)), ", \"se\": ", num(plain$se), ", \"tau2\": ", num(plain$tau2),
      ", \"i2\": ", num(plain$I2 / 100), ", \"q\": ", num(plain$QE), ", \"q_p\": ", num(plain$QEp),
      ", \"ci_plain\": ", vec(c(plain$ci.lb, plain$ci.ub)), ", \"ci_knha\": ", vec(c(knha$ci.lb, knha$ci.ub)),
      ", \"ci_adhoc\": ", vec(c(adhoc$ci.lb, adhoc$ci.ub)),
      ", \"pi\": ", vec(c(plain$b - half, plain$b + half)),
      ", \"fe_estimate\": ", num(c(fe$b)), ", \"fe_ci\": ", vec(c(fe$ci.lb, fe$ci.ub)), "}",
      if (j < length(sets)) "," else "", "\n", sep = "")
}
cat("}\n")
