# Reference values for right-censored and interval-censored parametric survival fits.
# Source: R's survival package (Therneau), function survreg, intercept-only models, on the
# package's open data sets `lung` (NCCTG lung cancer trial) and `veteran` (Veterans'
# Administration lung cancer trial). Run from the repository root:
#   Rscript reference/survival_reference.R
# Writes into lib-core/src/test/resources/org/incipit/core/estimate/.
suppressPackageStartupMessages(library(survival))
out <- "lib-core/src/test/resources/org/incipit/core/estimate"
header <- function(what) {
  c(paste0("# ", what),
    paste0("# R ", paste(R.version$major, R.version$minor, sep = "."),
           ", survival ", as.character(packageVersion("survival")),
           "; script reference/survival_reference.R"))
}
write_csv <- function(df, file, what) {
  path <- file.path(out, file)
  writeLines(header(what), path)
  suppressWarnings(write.table(df, path, sep = ",", row.names = FALSE, quote = FALSE, na = "",
                               append = TRUE, col.names = TRUE))
}

# Data: time in days, event = 1 for an observed death, 0 for right-censored.
lung_df <- data.frame(time = lung$time, event = as.integer(lung$status == 2))
vet_df <- data.frame(time = veteran$time, event = as.integer(veteran$status == 1))
write_csv(lung_df, "lung.csv", "survival::lung, time (days) and event (status == 2)")
write_csv(vet_df, "veteran.csv", "survival::veteran, time (days) and event (status == 1)")

# Interval-censored version of lung: each observed death time is known only to within its
# 30-day period [30 k, 30 (k + 1)); censored times stay right-censored at their time.
k <- floor(lung$time / 30)
ic_left <- ifelse(lung_df$event == 1, ifelse(k == 0, NA, 30 * k), lung$time)
ic_right <- ifelse(lung_df$event == 1, 30 * (k + 1), NA)
# A death in the first period has left bound 0, which log-time models cannot take: it is written
# as left-censored (left empty, contribution F(right)).
ic_df <- data.frame(left = ic_left, right = ic_right)
write_csv(ic_df, "lung_interval.csv",
          "survival::lung deaths grouped into 30-day intervals [left, right); left empty = left-censored (F(right)); right empty = right-censored at left")

rows <- list()
fit_one <- function(name, surv, dist, data) {
  fit <- survreg(surv ~ 1, data = data, dist = dist)
  v <- vcov(fit)
  mu <- unname(coef(fit)[1])
  logsig <- log(fit$scale)
  # Natural parameters: Weibull shape = 1 / scale, Weibull scale = exp(intercept);
  # lognormal meanLog = intercept, sdLog = scale.
  if (dist == "weibull") {
    p1 <- 1 / fit$scale; p2 <- exp(mu)
  } else {
    p1 <- mu; p2 <- fit$scale
  }
  data.frame(case = name, dist = dist, intercept = sprintf("%.15g", mu),
             log_scale = sprintf("%.15g", logsig),
             se_intercept = sprintf("%.15g", sqrt(v[1, 1])),
             se_log_scale = sprintf("%.15g", sqrt(v[2, 2])),
             cov_intercept_log_scale = sprintf("%.15g", v[1, 2]),
             param1 = sprintf("%.15g", p1), param2 = sprintf("%.15g", p2),
             loglik = sprintf("%.15g", fit$loglik[2]), iterations = fit$iter)
}
for (dist in c("weibull", "lognormal")) {
  rows[[length(rows) + 1]] <- fit_one("lung", Surv(lung_df$time, lung_df$event), dist, lung_df)
  rows[[length(rows) + 1]] <- fit_one("veteran", Surv(vet_df$time, vet_df$event), dist, vet_df)
  rows[[length(rows) + 1]] <- fit_one("lung_interval",
                                      Surv(ic_df$left, ic_df$right, type = "interval2"), dist, ic_df)
}
res <- do.call(rbind, rows)
write_csv(res, "survreg_reference.csv",
          "survreg(Surv(...) ~ 1, dist = weibull|lognormal); param1/param2 = Weibull shape/scale or lognormal meanLog/sdLog; loglik on the time scale")

# Check that survreg's log-likelihood is the plain density/survival log-likelihood in time units.
fw <- survreg(Surv(time, event) ~ 1, data = lung_df, dist = "weibull")
sh <- 1 / fw$scale; sc <- exp(coef(fw)[1])
direct <- sum(ifelse(lung_df$event == 1,
                     dweibull(lung_df$time, sh, sc, log = TRUE),
                     pweibull(lung_df$time, sh, sc, lower.tail = FALSE, log.p = TRUE)))
stopifnot(abs(direct - fw$loglik[2]) < 1e-8)
cat("written to", out, "\n")
