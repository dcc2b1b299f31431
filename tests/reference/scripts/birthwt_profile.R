# Reference values for profile-likelihood 95% intervals: the birthwt model
# low ~ age + lwt + race + ftv (MASS::birthwt, Debian package r-cran-mass, via
# tests/reference/data/birthwt.csv) fitted by R's glm, two ways:
#  - exact: for each coefficient, uniroot on the deviance of glm with that coefficient fixed
#    (offset) minus the minimum deviance minus qchisq(0.95, 1), to tolerance 1e-10;
#  - MASS: confint() on the glm (MASS's profile method, which interpolates a profile grid).
# Run from the repository root:  Rscript tests/reference/scripts/birthwt_profile.R
# Writes tests/reference/data/birthwt_profile.csv.
library(MASS)
d <- read.csv("tests/reference/data/birthwt.csv")
d$race <- factor(d$race, levels = c("black", "other", "white"))
ctl <- glm.control(epsilon = 1e-14, maxit = 100)
fit <- glm(low ~ age + lwt + race + ftv, family = binomial, data = d, control = ctl)
X <- model.matrix(fit)
y <- d$low
target <- deviance(fit) + qchisq(0.95, 1)
profile_dev <- function(j, b) {
  others <- X[, -j, drop = FALSE]
  g <- glm.fit(others, y, family = binomial(), offset = b * X[, j], intercept = FALSE,
               control = ctl)
  g$deviance - target
}
se <- sqrt(diag(vcov(fit)))
mass <- suppressMessages(confint(fit))
rows <- data.frame()
for (j in seq_len(ncol(X))) {
  b <- coef(fit)[j]
  lo <- uniroot(function(v) profile_dev(j, v), c(b - 10 * se[j], b), tol = 1e-10)$root
  hi <- uniroot(function(v) profile_dev(j, v), c(b, b + 10 * se[j]), tol = 1e-10)$root
  rows <- rbind(rows, data.frame(term = colnames(X)[j], estimate = sprintf("%.17g", b),
                                 exact_lo = sprintf("%.17g", lo), exact_hi = sprintf("%.17g", hi),
                                 mass_lo = sprintf("%.17g", mass[j, 1]),
                                 mass_hi = sprintf("%.17g", mass[j, 2])))
}
con <- file("tests/reference/data/birthwt_profile.csv", "w")
writeLines(paste0("# R's glm on MASS::birthwt, written by tests/reference/scripts/",
                  "birthwt_profile.R; ", R.version.string), con)
write.csv(rows, con, row.names = FALSE, quote = FALSE)
close(con)
