# Model updating on birthwt (r-cran-mass) with R's glm as the reference: the published model
# low ~ age + lwt + race + ftv (Hosmer & Lemeshow, Applied Logistic Regression 2nd ed.;
# coefficients from memory, docs/methods.md) updated by intercept (offset), logistic recalibration
# (a + b LP) and full refit; deviances and likelihood-ratio tests of each update against the
# refit (closed testing, Vergouwe et al. 2017, sequence from memory).
# Run: Rscript tests/reference/scripts/birthwt_update.R > tests/reference/data/birthwt_update.json
library(MASS)
d <- birthwt
lp <- 1.295 - 0.024 * d$age - 0.014 * d$lwt + 1.004 * (d$race == 2) + 0.433 * (d$race == 3) -
  0.049 * d$ftv
y <- d$low
p <- plogis(lp)
d0 <- -2 * sum(y * log(p) + (1 - y) * log(1 - p))
m1 <- glm(y ~ 1, offset = lp, family = binomial)
m2 <- glm(y ~ lp, family = binomial)
d$race <- factor(d$race, levels = 1:3, labels = c("white", "black", "other"))
m3 <- glm(low ~ age + lwt + race + ftv, data = d, family = binomial)
lr <- function(dev, df) c(dev - deviance(m3), df, pchisq(dev - deviance(m3), df, lower.tail = FALSE))
num <- function(x) formatC(x, digits = 15, format = "g")
vec <- function(x) paste0("[", paste(num(x), collapse = ","), "]")
cat("{\n")
cat('  "source": "tests/reference/scripts/birthwt_update.R (R glm)",\n')
cat('  "r_version": "', R.version.string, '",\n', sep = "")
cat('  "deviance_original":', num(d0), ",\n")
cat('  "deviance_intercept":', num(deviance(m1)), ",\n")
cat('  "deviance_recalibrate":', num(deviance(m2)), ",\n")
cat('  "deviance_refit":', num(deviance(m3)), ",\n")
cat('  "intercept_update_a":', num(coef(m1)[1]), ",\n")
cat('  "recalibration_a":', num(coef(m2)[1]), ",\n")
cat('  "recalibration_b":', num(coef(m2)[2]), ",\n")
cat('  "refit_coefficients":', vec(coef(m3)), ",\n")
cat('  "refit_terms": ["(Intercept)", "age", "lwt", "race black", "race other", "ftv"],\n')
cat('  "lr_original_vs_refit":', vec(lr(d0, 6)), ",\n")
cat('  "lr_intercept_vs_refit":', vec(lr(deviance(m1), 5)), ",\n")
cat('  "lr_recalibrate_vs_refit":', vec(lr(deviance(m2), 4)), ",\n")
# Miscalibrated versions of the same model, LP -> c + k * LP (invented distortions to exercise
# every branch of the procedure, not published models).
distort <- function(name, c0, k, last) {
  lpm <- c0 + k * lp
  pm <- plogis(lpm)
  dm0 <- -2 * sum(y * log(pm) + (1 - y) * log(1 - pm))
  mm1 <- glm(y ~ 1, offset = lpm, family = binomial)
  mm2 <- glm(y ~ lpm, family = binomial)
  steps <- rbind(lr(dm0, 6), lr(deviance(mm1), 5), lr(deviance(mm2), 4))
  alpha <- 0.05
  suggested <- if (steps[1, 3] >= alpha) "none" else if (steps[2, 3] >= alpha) "intercept" else
    if (steps[3, 3] >= alpha) "recalibrate" else "refit"
  cat('  "', name, '": {"c": ', num(c0), ', "k": ', num(k), ',\n', sep = "")
  cat('    "deviance_original":', num(dm0), ",\n")
  cat('    "deviance_intercept":', num(deviance(mm1)), ",\n")
  cat('    "deviance_recalibrate":', num(deviance(mm2)), ",\n")
  cat('    "recalibration_a":', num(coef(mm2)[1]), ",\n")
  cat('    "recalibration_b":', num(coef(mm2)[2]), ",\n")
  cat('    "lr_p_values":', vec(steps[, 3]), ",\n")
  cat('    "suggested": "', suggested, '"}', if (last) "\n" else ",\n", sep = "")
}
distort("distorted_intercept", 1.0, 2.0, FALSE)
distort("distorted_slope", 0.5, 2.5, TRUE)
cat("}\n")
