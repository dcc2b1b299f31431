# Paired DeLong test computed by hand from the 1988 definitions (DeLong, DeLong &
# Clarke-Pearson, Biometrics 1988;44:837-45), no AUC package: pairwise kernel
# psi(x, y) = 1 if x > y, 1/2 if x == y, 0 otherwise; placement values V10 (events), V01
# (non-events); S = S10/m + S01/n; z = (A1 - A2) / sqrt(S11 + S22 - 2 S12).
# Data: birthwt (Hosmer & Lemeshow) from the Debian package r-cran-mass.
# Scores: A = -lwt (lighter mothers at higher risk), B = smoke + ptl + ht (many ties).
# Run: Rscript tests/reference/scripts/paired_delong_birthwt.R > tests/reference/data/paired_delong_birthwt.json
library(MASS)
d <- birthwt
y <- d$low
scores <- list(a = -d$lwt, b = d$smoke + d$ptl + d$ht)
psi <- function(x, y) (x > y) + 0.5 * (x == y)
ev <- y == 1
m <- sum(ev); n <- sum(!ev)
placements <- lapply(scores, function(s) {
  k <- outer(s[ev], s[!ev], psi)          # m x n
  list(v10 = rowMeans(k), v01 = colMeans(k), auc = mean(k))
})
V10 <- sapply(placements, `[[`, "v10")
V01 <- sapply(placements, `[[`, "v01")
S <- cov(V10) / m + cov(V01) / n
auc <- sapply(placements, `[[`, "auc")
se <- sqrt(S[1, 1] + S[2, 2] - 2 * S[1, 2])
z <- (auc[1] - auc[2]) / se
p <- 2 * pnorm(-abs(z))
num <- function(x) formatC(x, digits = 15, format = "g")
vec <- function(x) paste0("[", paste(num(x), collapse = ","), "]")
cat("{\n")
cat('  "source": "tests/reference/scripts/paired_delong_birthwt.R (R, DeLong 1988 by hand)",\n')
cat('  "outcome":', vec(y), ",\n")
cat('  "score_a":', vec(scores$a), ",\n")
cat('  "score_b":', vec(scores$b), ",\n")
cat('  "auc_a":', num(auc[1]), ",\n")
cat('  "auc_b":', num(auc[2]), ",\n")
cat('  "var_a":', num(S[1, 1]), ",\n")
cat('  "var_b":', num(S[2, 2]), ",\n")
cat('  "cov_ab":', num(S[1, 2]), ",\n")
cat('  "se_difference":', num(se), ",\n")
cat('  "z":', num(z), ",\n")
cat('  "p_value":', num(p), "\n")
cat("}\n")
