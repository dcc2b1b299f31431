# Restricted cubic spline basis values computed in R straight from Harrell's formula
# (Regression Modeling Strategies, 2nd ed., section 2.4.5; Hmisc is not installed on the
# reference machine, so this is an independent implementation of the published formula, not a
# run of Harrell's own code):
#   basis j = (x - t_j)+^3 - (x - t_{k-1})+^3 (t_k - t_j)/(t_k - t_{k-1})
#             + (x - t_k)+^3 (t_{k-1} - t_j)/(t_k - t_{k-1}),   divided by (t_k - t_1)^2.
# Run from the repository root:  Rscript tests/reference/scripts/rcs_basis.R
knots <- c(23, 41.5, 55, 68, 82)
x <- c(10, 23, 30, 41.5, 50, 55, 60.25, 68, 75, 82, 95)
k <- length(knots)
pos3 <- function(v) pmax(v, 0)^3
rows <- list()
for (j in 1:(k - 2)) {
  b <- pos3(x - knots[j]) -
    pos3(x - knots[k - 1]) * (knots[k] - knots[j]) / (knots[k] - knots[k - 1]) +
    pos3(x - knots[k]) * (knots[k - 1] - knots[j]) / (knots[k] - knots[k - 1])
  rows[[j]] <- data.frame(basis = j, x = x, unscaled = sprintf("%.17g", b),
                          scaled = sprintf("%.17g", b / (knots[k] - knots[1])^2))
}
con <- file("tests/reference/data/rcs_basis.csv", "w")
writeLines(paste0("# knots ", paste(knots, collapse = " "),
                  "; written by tests/reference/scripts/rcs_basis.R; ", R.version.string), con)
write.csv(do.call(rbind, rows), con, row.names = FALSE, quote = FALSE)
close(con)
