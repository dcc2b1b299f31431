# Reference values for the logistic fitter: R's glm on MASS::birthwt (Hosmer & Lemeshow's
# low-birth-weight study, n = 189), run to full convergence.
# Data: MASS (Venables & Ripley), Debian package r-cran-mass, licence GPL-2 | GPL-3.
# Run from the repository root:  Rscript tests/reference/scripts/birthwt_glm.R
# Writes tests/reference/data/birthwt.csv and tests/reference/data/birthwt_glm.csv.
library(MASS)
d <- birthwt
# race 1/2/3 as text so the cohort reader sees a categorical column (white is the reference).
d$race <- c("white", "black", "other")[d$race]
write.csv(d, "tests/reference/data/birthwt.csv", row.names = FALSE, quote = FALSE)
d$race <- factor(d$race, levels = c("white", "black", "other"))
ctl <- glm.control(epsilon = 1e-14, maxit = 100)

rows <- list()
add <- function(model, term, value, se = NA) {
  rows[[length(rows) + 1]] <<- data.frame(model = model, term = term,
                                         value = sprintf("%.17g", value),
                                         se = ifelse(is.na(se), "", sprintf("%.17g", se)))
}
record <- function(model, fit) {
  s <- summary(fit)$coefficients
  for (i in seq_len(nrow(s))) add(model, rownames(s)[i], s[i, 1], s[i, 2])
  add(model, "deviance", fit$deviance)
  add(model, "null_deviance", fit$null.deviance)
  add(model, "aic", fit$aic)
}

# 1. low ~ age + lwt + race + ftv (Hosmer & Lemeshow, Applied Logistic Regression, table 2.2).
record("main", glm(low ~ age + lwt + race + ftv, family = binomial, data = d, control = ctl))
# 2. With an offset: the null deviance then belongs to intercept + offset (R's definition).
record("offset", glm(low ~ age, offset = lwt / 100, family = binomial, data = d, control = ctl))
# 3. Without an intercept and with an offset: the null model is the offset alone.
record("offset_no_intercept",
       glm(low ~ 0 + age, offset = lwt / 100 - 1, family = binomial, data = d, control = ctl))

out <- do.call(rbind, rows)
con <- file("tests/reference/data/birthwt_glm.csv", "w")
writeLines(paste0("# R's glm on MASS::birthwt, written by tests/reference/scripts/birthwt_glm.R; ",
                  R.version.string), con)
write.csv(out, con, row.names = FALSE, quote = FALSE)
close(con)
