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

# 3. Per imputation: each measure and its within-imputation variance on its pooling scale, then
#    Rubin's rules (tests/reference/scripts/pima_measures.R).
source("tests/reference/scripts/pima_measures.R")
n <- nrow(val); m <- 5
est <- matrix(NA, 5, m, dimnames = list(measures, NULL)); var_w <- est
for (i in 1:m) {
  one <- copy_measures(long[long$.imp == i, ], vars, b)
  est[, i] <- one$est; var_w[, i] <- one$var_w
}
pooled <- rubin_pool(est, var_w, n)
cc <- complete.cases(val[, c(vars, "diabetic")])
writeLines(toJSON(list(source = "tests/reference/scripts/pima_imputation.R",
                       r_version = R.version.string,
                       mice_version = as.character(packageVersion("mice")),
                       m = m, n = n, complete_cases = sum(cc), pooled = pooled),
                  digits = NA, auto_unbox = TRUE, pretty = TRUE),
           file.path(out, "pima_imputation.json"))
