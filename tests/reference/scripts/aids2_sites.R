# Multi-site reference for `calivera validate --cluster`: per-site measures computed by hand in R
# from their definitions, pooled with R's general-purpose meta-analysis package metafor (Debian
# r-cran-metafor 3.8-1, Viechtbauer, J Stat Softw 2010).
# Data: Aids2 (Australian AIDS survival, 2843 patients; Venables & Ripley) from the Debian package
# r-cran-mass. The cluster column is the real `state` (NSW, Other, QLD, VIC).
# Outcome: dead = status "D" at the end of follow-up. Risk: a logistic model of dead on age, sex
# and year of diagnosis fitted to the whole cohort (a worked setup, not a clinical model).
# Run from the repository root:
#   Rscript tests/reference/scripts/aids2_sites.R
# writes tests/reference/data/aids2_sites.csv (state, dead, risk) and
# tests/reference/data/aids2_sites.json (per-site and pooled values).
suppressMessages(library(metafor))
data(Aids2, package = "MASS")
d <- Aids2
d$dead <- as.integer(d$status == "D")
d$male <- as.integer(d$sex == "M")
d$year <- d$diag / 365.25 + 1960
fit <- glm(dead ~ age + male + year, family = binomial, data = d)
d$risk <- fitted(fit)
num <- function(x) formatC(x, digits = 17, format = "g")
out <- data.frame(state = as.character(d$state), dead = d$dead, risk = num(d$risk))
write.csv(out, "tests/reference/data/aids2_sites.csv", row.names = FALSE, quote = FALSE)
# Read back the risks as written, so R and Calivera work from the same numbers.
d$risk <- as.numeric(out$risk)
lp <- qlogis(d$risk)

psi <- function(x, y) (x > y) + 0.5 * (x == y)
# DeLong, DeLong & Clarke-Pearson (Biometrics 1988): placement values, variance with n - 1.
delong <- function(s, y) {
  ev <- y == 1
  k <- outer(s[ev], s[!ev], psi)
  v10 <- rowMeans(k); v01 <- colMeans(k)
  list(auc = mean(k), se = sqrt(var(v10) / sum(ev) + var(v01) / sum(!ev)))
}
sites <- levels(d$state)
rows <- lapply(sites, function(s) {
  i <- d$state == s
  y <- d$dead[i]; p <- d$risk[i]; l <- lp[i]
  a <- delong(p, y)
  O <- sum(y); E <- sum(p); n <- length(y)
  # Tight convergence: glm's SEs come from the weights of its last iteration.
  tight <- glm.control(epsilon = 1e-15, maxit = 100)
  ci <- summary(glm(y ~ 1, offset = l, family = binomial, control = tight))$coefficients
  sl <- summary(glm(y ~ l, family = binomial, control = tight))$coefficients
  data.frame(name = s, n = n, events = O, auc = a$auc, auc_se = a$se, oe = O / E,
             log_oe_se = sqrt(1 / O - 1 / n),  # binomial O with E fixed (Debray et al., BMJ 2017)
             cal_int = ci[1, 1], cal_int_se = ci[1, 2], cal_slope = sl[2, 1], cal_slope_se = sl[2, 2])
})
tab <- do.call(rbind, rows)

# Pooling on the scale where each measure is closest to normal (Snell et al. 2018, Debray et al. 2017).
measures <- list(
  c_statistic = list(y = qlogis(tab$auc), se = tab$auc_se / (tab$auc * (1 - tab$auc)), back = plogis, scale = "logit"),
  oe_ratio = list(y = log(tab$oe), se = tab$log_oe_se, back = exp, scale = "log"),
  calibration_intercept = list(y = tab$cal_int, se = tab$cal_int_se, back = identity, scale = "identity"),
  calibration_slope = list(y = tab$cal_slope, se = tab$cal_slope_se, back = identity, scale = "identity"))
ctl <- list(threshold = 1e-14, maxiter = 10000)
pooled <- lapply(measures, function(m) {
  vi <- m$se^2
  k <- length(vi)
  plain <- rma(m$y, vi, method = "REML", control = ctl)                 # Wald z interval
  knha <- rma(m$y, vi, method = "REML", test = "knha", control = ctl)   # Hartung-Knapp-Sidik-Jonkman
  adhoc <- rma(m$y, vi, method = "REML", test = "adhoc", control = ctl) # HKSJ, never narrower (max(1, q))
  fe <- rma(m$y, vi, method = "FE")
  # Prediction interval, Riley, Higgins & Deeks (BMJ 2011): t on k - 2 df, plain SE of the mean.
  half <- qt(0.975, k - 2) * sqrt(plain$tau2 + plain$se^2)
  list(scale = m$scale, k = k, yi = m$y, vi = vi,
       estimate = c(plain$b), se = plain$se, tau2 = plain$tau2, i2 = plain$I2 / 100, q = plain$QE,
       ci_plain = c(plain$ci.lb, plain$ci.ub), ci_knha = c(knha$ci.lb, knha$ci.ub),
       ci_adhoc = c(adhoc$ci.lb, adhoc$ci.ub), pi = c(plain$b - half, plain$b + half),
       fe_estimate = c(fe$b), fe_ci = c(fe$ci.lb, fe$ci.ub))
})

vec <- function(x) paste0("[", paste(num(x), collapse = ", "), "]")
cat("{\n  \"source\": \"tests/reference/scripts/aids2_sites.R (R, metafor 3.8-1)\",\n  \"sites\": [\n",
    file = "tests/reference/data/aids2_sites.json")
w <- function(...) cat(..., file = "tests/reference/data/aids2_sites.json", append = TRUE, sep = "")
for (r in seq_len(nrow(tab))) {
  t <- tab[r, ]
  w("    {\"name\": \"", t$name, "\", \"n\": ", t$n, ", \"events\": ", t$events,
    ", \"auc\": ", num(t$auc), ", \"auc_se\": ", num(t$auc_se), ", \"oe_ratio\": ", num(t$oe),
    ", \"log_oe_se\": ", num(t$log_oe_se), ", \"calibration_intercept\": ", num(t$cal_int),
    ", \"calibration_intercept_se\": ", num(t$cal_int_se), ", \"calibration_slope\": ", num(t$cal_slope),
    ", \"calibration_slope_se\": ", num(t$cal_slope_se), "}", if (r < nrow(tab)) "," else "", "\n")
}
w("  ],\n  \"pooled\": {\n")
for (j in seq_along(pooled)) {
  p <- pooled[[j]]
  w("    \"", names(pooled)[j], "\": {\"scale\": \"", p$scale, "\", \"k\": ", p$k,
    ", \"estimate\": ", num(p$estimate), ", \"se\": ", num(p$se), ", \"tau2\": ", num(p$tau2),
    ", \"i2\": ", num(p$i2), ", \"q\": ", num(p$q), ", \"ci_plain\": ", vec(p$ci_plain),
    ", \"ci_knha\": ", vec(p$ci_knha), ", \"ci_adhoc\": ", vec(p$ci_adhoc), ", \"pi\": ", vec(p$pi),
    ", \"fe_estimate\": ", num(p$fe_estimate), ", \"fe_ci\": ", vec(p$fe_ci), "}",
    if (j < length(pooled)) "," else "", "\n")
}
w("  }\n}\n")
