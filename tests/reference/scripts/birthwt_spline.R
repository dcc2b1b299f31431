# Reference values for fitting a restricted cubic spline: R's glm with a natural cubic spline
# basis (splines::ns) on MASS::birthwt. A restricted cubic spline with knots t1..tk and a
# natural cubic spline with interior knots t2..t(k-1) and boundary knots t1, tk span the same
# functions (cubic between knots, linear beyond the outer ones), so the two fits have the same
# deviance and the same fitted risks although their coefficients differ.
# Knots: type-7 quantiles of age at .05 .35 .65 .95 (Harrell's default for 4 knots).
# Data: MASS (Debian package r-cran-mass) via tests/reference/data/birthwt.csv.
# Run from the repository root:  Rscript tests/reference/scripts/birthwt_spline.R
# Writes tests/reference/data/birthwt_spline.csv.
library(splines)
d <- read.csv("tests/reference/data/birthwt.csv")
d$race <- factor(d$race, levels = c("black", "other", "white"))
k <- quantile(d$age, c(0.05, 0.35, 0.65, 0.95), type = 7)
fit <- glm(low ~ ns(age, knots = k[2:3], Boundary.knots = k[c(1, 4)]) + lwt + race + smoke,
           family = binomial, data = d, control = glm.control(epsilon = 1e-14, maxit = 100))
out <- data.frame(
  key = c(sprintf("knot%d", 1:4), "deviance", sprintf("risk%d", 1:10)),
  value = sprintf("%.17g", c(unname(k), fit$deviance, fitted(fit)[1:10])))
con <- file("tests/reference/data/birthwt_spline.csv", "w")
writeLines(paste0("# R's glm + splines::ns on MASS::birthwt, written by ",
                  "tests/reference/scripts/birthwt_spline.R; ", R.version.string), con)
write.csv(out, con, row.names = FALSE, quote = FALSE)
close(con)
