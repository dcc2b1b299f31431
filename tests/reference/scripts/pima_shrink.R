# Uniform shrinkage with the intercept re-estimated (the shrunk model of internal validation) on
# MASS::Pima.tr (r-cran-mass), with R's glm as the reference: fit type ~ all seven predictors,
# multiply every coefficient but the intercept by a fixed factor s, then re-estimate the
# intercept with the shrunk linear predictor (no intercept) as offset. The offset is large and
# uncentred (glucose in mg/dL, ages in years), the case where a plain Newton iteration from 0
# diverges.
# Run: Rscript tests/reference/scripts/pima_shrink.R
#   writes tests/reference/data/pima_tr.csv and tests/reference/data/pima_shrink.json
library(MASS)
d <- Pima.tr
d$diabetic <- as.integer(d$type == "Yes")
d$type <- NULL
write.csv(d, "tests/reference/data/pima_tr.csv", row.names = FALSE, quote = FALSE)
m <- glm(diabetic ~ npreg + glu + bp + skin + bmi + ped + age, data = d, family = binomial,
         control = glm.control(epsilon = 1e-14, maxit = 100))
num <- function(x) formatC(x, digits = 15, format = "g")
out <- c()
for (s in c(0.9, 0.75)) {
  X <- model.matrix(m)[, -1]
  offset <- as.vector(s * X %*% coef(m)[-1])
  a <- glm(d$diabetic ~ 1, offset = offset, family = binomial,
           control = glm.control(epsilon = 1e-14, maxit = 100))
  out <- c(out, paste0('    {"shrinkage": ', trimws(num(s)), ', "intercept": ',
                       trimws(num(coef(a)[1])), "}"))
}
sink("tests/reference/data/pima_shrink.json")
cat("{\n")
cat('  "source": "tests/reference/scripts/pima_shrink.R (R glm with offset)",\n')
cat('  "r_version": "', R.version.string, '",\n', sep = "")
cat('  "n": ', nrow(d), ",\n", sep = "")
cat('  "intercept_unshrunk": ', num(coef(m)[1]), ",\n", sep = "")
cat('  "cases": [\n', paste(out, collapse = ",\n"), "\n  ]\n}\n", sep = "")
sink()
