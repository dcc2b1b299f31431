# Shared by pima_imputation.R and pima_mice_reference.R: each validation measure of one
# completed copy with its within-imputation variance on its pooling scale, and Rubin's rules by
# hand. Sourced from the repository root.
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

# d: one completed copy; b: the model's coefficients (intercept first) for the columns `vars`.
copy_measures <- function(d, vars, b) {
  est <- setNames(numeric(5), measures); var_w <- est
  lp <- as.vector(as.matrix(cbind(1, d[, vars])) %*% b)
  p <- plogis(lp); y <- d$diabetic; n <- length(y)
  a <- delong(p, y)
  est["c_statistic"] <- qlogis(a$auc)
  var_w["c_statistic"] <- (a$se / (a$auc * (1 - a$auc)))^2
  O <- sum(y); E <- sum(p)
  est["oe_ratio"] <- log(O / E); var_w["oe_ratio"] <- 1 / O - 1 / n
  # Variances: the inverse Fisher information at the maximum (summary.glm's comes from the
  # weights of the iteration before the last, which differs in the 8th digit).
  fi <- glm(y ~ offset(lp), family = binomial, control = ctl)
  wi <- fitted(fi) * (1 - fitted(fi))
  est["calibration_intercept"] <- coef(fi)[[1]]
  var_w["calibration_intercept"] <- 1 / sum(wi)
  fs <- glm(y ~ lp, family = binomial, control = ctl)
  X <- cbind(1, lp); ws <- fitted(fs) * (1 - fitted(fs))
  est["calibration_slope"] <- coef(fs)[[2]]
  var_w["calibration_slope"] <- solve(t(X) %*% (ws * X))[2, 2]
  sq <- (p - y)^2
  est["brier"] <- mean(sq); var_w["brier"] <- var(sq) / n
  list(est = est, var_w = var_w)
}

back <- function(x, scale) switch(scale, logit = plogis(x), log = exp(x), identity = x)

# Rubin (1987) by hand; Barnard & Rubin (Biometrika 1999) df with mice's floor on lambda; checked
# against mice's pool.scalar. est, var_w: measures x m.
rubin_pool <- function(est, var_w, n) {
  m <- ncol(est)
  pooled <- list()
  for (j in seq_along(measures)) {
    Q <- est[j, ]; U <- var_w[j, ]
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
  pooled
}
