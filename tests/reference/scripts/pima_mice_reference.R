# Reference for Calivera's own imputation (validate --impute, issue 17): the same validation
# cohort imputed by mice with many copies, so its pooled estimates carry a small Monte Carlo
# error, and that error stated beside them.
# Data: MASS::Pima.tr2 (300 records, 100 with missing bp, skin or bmi; Debian r-cran-mass,
# GPL-2 | GPL-3) and the model fitted on MASS::Pima.te by pima_imputation.R
# (tests/reference/data/pima_imputation_model.json). Imputation: mice (Debian r-cran-mice,
# GPL-2 | GPL-3) with its defaults for numeric columns (predictive mean matching, 5 donors, the
# outcome and every other column as predictors), m = 100, maxit = 10, seed 2027.
# Monte Carlo standard error of a pooled estimate: sqrt(B / m), B the between-imputation
# variance (White, Royston & Wood, Stat Med 2011, section 7).
# Run from the repository root:  Rscript tests/reference/scripts/pima_mice_reference.R
# Writes tests/reference/data/pima_tr2.csv (the cohort with its missing values, for Calivera) and
# tests/reference/data/pima_mice_reference.json.
suppressMessages({ library(MASS); library(mice); library(jsonlite) })
source("tests/reference/scripts/pima_measures.R")
vars <- c("npreg", "glu", "bp", "skin", "bmi", "ped", "age")
model <- fromJSON("tests/reference/data/pima_imputation_model.json")
b <- c(model$intercept$coefficient,
       setNames(model$terms$estimate$coefficient, model$terms$variable)[vars])

val <- Pima.tr2
val$diabetic <- as.numeric(val$type == "Yes")
val$type <- NULL
write.csv(val, "tests/reference/data/pima_tr2.csv", row.names = FALSE, quote = FALSE, na = "NA")
m <- 100
imp <- mice(val, m = m, maxit = 10, seed = 2027, printFlag = FALSE)
est <- matrix(NA, 5, m, dimnames = list(measures, NULL)); var_w <- est
for (i in 1:m) {
  one <- copy_measures(complete(imp, i), vars, b)
  est[, i] <- one$est; var_w[, i] <- one$var_w
}
pooled <- rubin_pool(est, var_w, nrow(val))
for (j in measures) {
  pooled[[j]]$monte_carlo_se <- sqrt(pooled[[j]]$between_variance / m)
  pooled[[j]]$per_imputation <- NULL
  pooled[[j]]$per_imputation_variance <- NULL
}
writeLines(toJSON(list(source = "tests/reference/scripts/pima_mice_reference.R",
                       r_version = R.version.string,
                       mice_version = as.character(packageVersion("mice")),
                       m = m, maxit = 10, n = nrow(val), pooled = pooled),
                  digits = NA, auto_unbox = TRUE, pretty = TRUE),
           "tests/reference/data/pima_mice_reference.json")
