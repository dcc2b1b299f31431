# Reference values for the validation metrics, computed with base R only (glm, loess, quantile,
# prop.test and hand-written formulas; no validation package) on the Wisconsin diagnostic
# breast-cancer data shipped by Debian's python3-sklearn.
#
# A logistic model malignant ~ mean radius + mean texture is fitted on a random 50% and applied to
# the other half; the predictions of that half are written to
# tests/reference/data/breast_cancer_validation_predictions.csv and the reference statistics to
# tests/reference/data/breast_cancer_validation_r.csv (name,value). Run from the repository root:
#   Rscript tests/reference/scripts/breast_cancer_validation.R
csv <- "/usr/lib/python3/dist-packages/sklearn/datasets/data/breast_cancer.csv"
raw <- read.csv(csv, skip = 1, header = FALSE)   # first line: "569,30,malignant,benign"
d <- data.frame(radius = raw$V1, texture = raw$V2, y = 1 - raw$V31)  # target 0 = malignant
set.seed(20240601)
dev <- sample(nrow(d), floor(nrow(d) / 2))
fit <- glm(y ~ radius + texture, family = binomial, data = d[dev, ])
val <- d[-dev, ]
lp <- predict(fit, newdata = val, type = "link")
p <- 1 / (1 + exp(-lp))
y <- val$y
out <- list()
put <- function(name, value) out[[name]] <<- value

m <- sum(y == 1); n0 <- sum(y == 0)
put("n", length(y)); put("events", m)
# Mann-Whitney AUC from ranks (midranks for ties).
r <- rank(p)
auc <- (sum(r[y == 1]) - m * (m + 1) / 2) / (m * n0)
put("auc", auc)
# DeLong et al. 1988 placement values by their definition.
pe <- p[y == 1]; pn <- p[y == 0]
v10 <- sapply(pe, function(x) mean((x > pn) + 0.5 * (x == pn)))
v01 <- sapply(pn, function(z) mean((pe > z) + 0.5 * (pe == z)))
se <- sqrt(var(v10) / m + var(v01) / n0)
put("auc_se", se)
lg <- log(auc / (1 - auc)); h <- qnorm(0.975) * se / (auc * (1 - auc))
put("auc_ci_lo", plogis(lg - h)); put("auc_ci_hi", plogis(lg + h))
put("discrimination_slope", mean(pe) - mean(pn))
brier <- mean((y - p)^2); prev <- mean(y)
put("brier", brier); put("brier_scaled", 1 - brier / (prev * (1 - prev)))
cil <- glm(y ~ offset(lp), family = binomial)
put("intercept", coef(cil)[[1]]); put("intercept_se", sqrt(vcov(cil)[1, 1]))
sl <- glm(y ~ lp, family = binomial)
put("slope", coef(sl)[[2]]); put("slope_se", sqrt(vcov(sl)[2, 2]))
put("slope_model_intercept", coef(sl)[[1]])
put("oe_ratio", sum(y) / sum(p))
z <- sum((y - p) * (1 - 2 * p)) / sqrt(sum((1 - 2 * p)^2 * p * (1 - p)))
put("spiegelhalter_z", z); put("spiegelhalter_p", 2 * pnorm(-abs(z)))
lo <- loess(y ~ p, span = 0.75, degree = 2, family = "gaussian", surface = "direct")
e <- abs(p - fitted(lo))
put("ici", mean(e)); put("e50", median(e)); put("e90", quantile(e, 0.9, type = 7)[[1]])
put("emax", max(e))
# Hosmer-Lemeshow: type-7 deciles, unique breaks, right-closed with the lowest included.
g <- 10
breaks <- unique(quantile(p, probs = (0:g) / g, type = 7))
grp <- cut(p, breaks = breaks, include.lowest = TRUE, right = TRUE)
O <- tapply(y, grp, sum); E <- tapply(p, grp, sum); N <- tapply(y, grp, length)
hl <- sum((O - E)^2 / (E * (1 - E / N)))
put("hl_statistic", hl); put("hl_groups", length(N))
put("hl_p_new_data", 1 - pchisq(hl, length(N)))
put("hl_p_apparent", 1 - pchisq(hl, length(N) - 2))
for (k in seq_along(N)) {
  put(sprintf("group%d_n", k), N[[k]]); put(sprintf("group%d_observed", k), O[[k]])
  put(sprintf("group%d_expected", k), E[[k]])
  w <- prop.test(O[[k]], N[[k]], correct = FALSE)$conf.int   # Wilson score interval
  put(sprintf("group%d_ci_lo", k), w[1]); put(sprintf("group%d_ci_hi", k), w[2])
}
for (t in c(0.1, 0.2, 0.3, 0.5)) {
  flag <- p >= t
  tp <- sum(flag & y == 1); fp <- sum(flag & y == 0); nn <- length(y)
  nb <- tp / nn - fp / nn * t / (1 - t)
  all <- prev - (1 - prev) * t / (1 - t)
  put(sprintf("nb_%.2f", t), nb); put(sprintf("nb_all_%.2f", t), all)
  put(sprintf("avoided_%.2f", t), (nb - all) / (t / (1 - t)) * 100)
  put(sprintf("sensitivity_%.2f", t), tp / m); put(sprintf("specificity_%.2f", t), sum(!flag & y == 0) / n0)
}
write.csv(data.frame(outcome = y, risk = sprintf("%.17g", p), lp = sprintf("%.17g", lp)),
          "tests/reference/data/breast_cancer_validation_predictions.csv", row.names = FALSE,
          quote = FALSE)
write.csv(data.frame(name = names(out), value = sprintf("%.17g", unlist(out))),
          "tests/reference/data/breast_cancer_validation_r.csv", row.names = FALSE, quote = FALSE)

# Loess with heavy ties (risks rounded to 2 decimals) and the boundary: R's fitted values at every
# patient, for the tie handling of the q-th nearest distance.
pt <- round(p, 2)
lt <- loess(y ~ pt, span = 0.75, degree = 2, family = "gaussian", surface = "direct")
write.csv(data.frame(outcome = y, risk = sprintf("%.17g", pt), fitted = sprintf("%.17g", fitted(lt))),
          "tests/reference/data/breast_cancer_loess_ties_r.csv", row.names = FALSE, quote = FALSE)
