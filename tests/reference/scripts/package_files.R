# Statistical-package copies of open datasets already used as CSV in the tests, written by R's
# general-purpose haven package (Debian r-cran-haven 2.5.1, which writes through ReadStat's
# writers) so the cohort reader can be checked against the CSV route.
# Data: MASS::birthwt and MASS::Pima.tr (Venables & Ripley's MASS, Debian r-cran-mass,
# GPL-2 | GPL-3).
# Run from the repository root:  Rscript tests/reference/scripts/package_files.R
# Writes tests/reference/data/package/*.
suppressMessages({ library(MASS); library(haven) })
out <- "tests/reference/data/package"
dir.create(out, showWarnings = FALSE, recursive = TRUE)

# 1. birthwt as in tests/reference/data/birthwt.csv, race as a labelled number
#    (1 white, 2 black, 3 other) and a visit date that no analysis may use as a number.
b <- birthwt
b$race <- labelled(as.numeric(b$race), labels = c(white = 1, black = 2, other = 3))
b$visit <- as.Date("2020-01-01") + seq_len(nrow(b))
write_dta(b, file.path(out, "birthwt.dta"), version = 14)
write_sav(b, file.path(out, "birthwt.sav"))
write_sav(b, file.path(out, "birthwt.zsav"), compress = TRUE)
s <- birthwt
s$race <- c("white", "black", "other")[s$race]  # SAS keeps labels in a catalog: text instead
s$visit <- b$visit
suppressWarnings(write_sas(s, file.path(out, "birthwt.sas7bdat")))

# 2. The same with lwt missing in 7 records, written as each format's own missing value: SPSS
#    user-defined missing code 999, Stata tagged missing .a, SAS system missing. The CSV copy
#    has NA there.
gone <- c(3, 17, 40, 88, 101, 150, 189)
m <- birthwt
m$race <- c("white", "black", "other")[m$race]
m$lwt[gone] <- NA
write.csv(m, file.path(out, "birthwt_missing.csv"), row.names = FALSE, quote = FALSE, na = "NA")
spss <- birthwt
spss$race <- labelled(as.numeric(spss$race), labels = c(white = 1, black = 2, other = 3))
lwt <- as.numeric(spss$lwt)
lwt[gone] <- 999
spss$lwt <- labelled_spss(lwt, labels = c(refused = 999), na_values = 999)
write_sav(spss, file.path(out, "birthwt_missing.sav"))
stata <- birthwt
stata$race <- spss$race
lwt <- as.numeric(stata$lwt)
lwt[gone] <- tagged_na("a")
stata$lwt <- lwt
write_dta(stata, file.path(out, "birthwt_missing.dta"), version = 14)
sas <- m
suppressWarnings(write_sas(sas, file.path(out, "birthwt_missing.sas7bdat")))

# 3. Pima.tr with the outcome as a labelled number (0 No, 1 Yes) and a string copy of it.
p <- Pima.tr
p$diabetic <- labelled(as.numeric(p$type == "Yes"), labels = c(No = 0, Yes = 1))
p$type <- as.character(p$type)
write_sav(p, file.path(out, "pima_tr.sav"))
# Two codes sharing one label: the column must be refused, not merged.
q <- p
q$bp_band <- labelled(as.numeric(cut(q$bp, c(0, 70, 80, 200))),
                      labels = c(low = 1, high = 2, high = 3))
write_dta(q, file.path(out, "pima_shared_label.dta"), version = 14)
