# Reference values for validation with multiple imputation (issue 17): Rubin's rules with the
# Barnard-Rubin degrees of freedom, computed by hand and by mice's pool.scalar, on stacked
# imputations made by mice.
# Data: MASS::Pima.te (332 complete records: the model's development data) and MASS::Pima.tr2
# (300 records, 100 of them with missing bp, skin or bmi: the validation cohort), Venables &
# Ripley's MASS (Debian r-cran-mass, GPL-2 | GPL-3). Imputation: mice 3.15.0 (Debian r-cran-mice,
# GPL-2 | GPL-3), predictive mean matching, m = 5, seed 2026.
# Run from the repository root:  Rscript tests/reference/scripts/pima_imputation.R
# Writes tests/reference/data/pima_imputation_model.json, pima_tr2_imputed.csv and
# pima_imputation.json.
suppressMessages({ library(MASS); library(mice); library(jsonlite) })
out <- "tests/reference/data/"
vars <- c("npreg", "glu", "bp", "skin", "bmi", "ped", "age")

# 1. The model: glm on Pima.te, written as a Calivera model file (coefficients to 17 digits).
dev <- Pima.te
dev$diabetic <- as.numeric(dev$type == "Yes")
fit <- glm(reformulate(vars, "diabetic"), family = binomial, data = dev,
           control = glm.control(epsilon = 1e-14, maxit = 100))
b <- coef(fit); se <- sqrt(diag(vcov(fit)))
num <- function(x) sprintf("%.17g", x)
terms <- sapply(vars, function(v) sprintf(
  '    {"name": "%s", "variable": "%s", "transform": "linear", "center": 0.0, "scale": 1.0,\n     "estimate": {"coefficient": %s, "se": %s}}',
  v, v, num(b[[v]]), num(se[[v]])))
writeLines(c('{', '  "format": "calivera-model/1",',
             '  "name": "Pima diabetes model fitted on MASS::Pima.te (a worked setup, not a clinical model)",',
             '  "outcome": "diabetic",',
             sprintf('  "intercept": {"coefficient": %s, "se": %s},', num(b[["(Intercept)"]]),
                     num(se[["(Intercept)"]])),
             '  "terms": [', paste(terms, collapse = ",\n"), '  ]', '}'),
           file.path(out, "pima_imputation_model.json"))

# 2. Stacked imputations of Pima.tr2 (the outcome is complete and used in every imputation
#    model), with the original data as .imp = 0.
val <- Pima.tr2
val$diabetic <- as.numeric(val$type == "Yes")
val$type <- NULL
imp <- mice(val, m = 5, seed = 2026, printFlag = FALSE)
long <- complete(imp, action = "long", include = TRUE)
write.csv(long, file.path(out, "pima_tr2_imputed.csv"), row.names = FALSE, quote = FALSE,
          na = "NA")

# 3. Per imputation: each measure and its within-imputation variance on its pooling scale.
psi <- function(x, y) (x > y) + 0.5 * (x == y)
delong <- function(s, y) {  # DeLong et al., Biometrics 1988; placement values, n - 1 variances
  ev <- y == 1
  k <- outer(s[ev], s[!ev], psi)
  v10 <- rowMeans(k); v01 <- colMeans(k)
  list(auc = mean(k), se = sqrt(var(v10) / sum(ev) + var(v01) / sum(!ev)))
}
ctl <- glm.control(epsilon = 1e-15, maxit = 100)
measures <- c("c_statistic", "oe_ratio", "calibration_intercept", "calibration_slope", "brier")
scales <- c("logit", "log", "identity", "identity", "identity")
k <- c(1, 1, 1, 2, 1)  # parameters of each measure's complete-data model
est <- matrix(NA, 5, 5, dimnames = list(measures, NULL)); var_w <- est
for (i in 1:5) {
  d <- long[long$.imp == i, ]
  lp <- as.vector(as.matrix(cbind(1, d[, vars])) %*% b)
  p <- plogis(lp); y <- d$diabetic; n <- length(y)
  a <- delong(p, y)
  est["c_statistic", i] <- qlogis(a$auc)
  var_w["c_statistic", i] <- (a$se / (a$auc * (1 - a$auc)))^2
  O <- sum(y); E <- sum(p)
  est["oe_ratio", i] <- log(O / E); var_w["oe_ratio", i] <- 1 / O - 1 / n
  # Variances: the inverse Fisher information at the maximum (summary.glm's comes from the
  # weights of the iteration before the last, which differs in the 8th digit).
  fi <- glm(y ~ offset(lp), family = binomial, control = ctl)
  wi <- fitted(fi) * (1 - fitted(fi))
  est["calibration_intercept", i] <- coef(fi)[[1]]
  var_w["calibration_intercept", i] <- 1 / sum(wi)
  fs <- glm(y ~ lp, family = binomial, control = ctl)
  X <- cbind(1, lp); ws <- fitted(fs) * (1 - fitted(fs))
  est["calibration_slope", i] <- coef(fs)[[2]]
  var_w["calibration_slope", i] <- solve(t(X) %*% (ws * X))[2, 2]
  sq <- (p - y)^2
  est["brier", i] <- mean(sq); var_w["brier", i] <- var(sq) / n
}
n <- nrow(val); m <- 5
back <- function(x, scale) switch(scale, logit = plogis(x), log = exp(x), identity = x)
pooled <- list()
for (j in seq_along(measures)) {
  Q <- est[j, ]; U <- var_w[j, ]
  # Rubin (1987) by hand; Barnard & Rubin (Biometrika 1999) df with mice's floor on lambda.
  qbar <- mean(Q); ubar <- mean(U); B <- var(Q); Tt <- ubar + (1 + 1 / m) * B
  lambda <- max((1 + 1 / m) * B / Tt, 1e-4)
  dfcom <- n - k[j]
  dfold <- (m - 1) / lambda^2
  dfobs <- (dfcom + 1) / (dfcom + 3) * dfcom * (1 - lambda)
  df <- dfold * dfobs / (dfold + dfobs)
  r <- (1 + 1 / m) * B / ubar
  fmi <- (r + 2 / (df + 3)) / (r + 1)
  ps <- pool.scalar(Q, U, n = n, k = k[j])
  stopifnot(abs(ps$qbar - qbar) < 1e-14, abs(ps$t - Tt) < 1e-14, abs(ps$df - df) < 1e-8,
            abs(ps$fmi - fmi) < 1e-12)
  half <- qt(0.975, df) * sqrt(Tt)
  pooled[[measures[j]]] <- list(
    scale = scales[j], estimate_on_scale = qbar, estimate = back(qbar, scales[j]),
    ci = c(back(qbar - half, scales[j]), back(qbar + half, scales[j])),
    within_variance = ubar, between_variance = B, total_variance = Tt,
    fraction_missing_information = fmi, df = df, complete_data_df = dfcom,
    per_imputation = unname(Q), per_imputation_variance = unname(U))
}
cc <- complete.cases(val[, c(vars, "diabetic")])
writeLines(toJSON(list(source = "tests/reference/scripts/pima_imputation.R",
                       r_version = R.version.string,
                       mice_version = as.character(packageVersion("mice")),
                       m = m, n = n, complete_cases = sum(cc), pooled = pooled),
                  digits = NA, auto_unbox = TRUE, pretty = TRUE),
           file.path(out, "pima_imputation.json"))
