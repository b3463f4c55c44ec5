# Reference values for org.incipit.core.growth log-linear growth fits.
# Run from the repository root:  Rscript reference/growth_reference.R
# Writes lib-core/src/test/resources/org/incipit/core/growth/growth_data.csv and growth_fits.csv.
# Calls: stats::glm(count ~ day [+ dow], family = poisson(link = "log")),
#        MASS::glm.nb(count ~ day [+ dow], control = glm.control(epsilon = 1e-13, maxit = 200)),
#        MASS confint() (profile of the glm deviance, theta held fixed for glm.nb, spline-interpolated),
#        and exact profile-likelihood limits for the day coefficient found by uniroot on the
#        profile log-likelihood (other coefficients and, for negative binomial, theta re-maximised).
# Negative-binomial fits only for the series simulated with finite theta (on Poisson series the
# ML theta runs off to infinity).
# Day-of-week factor: dow = factor(day %% 7), treatment contrasts (reference = smallest level present).
# Invented data: seeded simulated count series, no real outbreak data.
suppressPackageStartupMessages(library(MASS))
out <- "lib-core/src/test/resources/org/incipit/core/growth"
hdr <- sprintf("# %s; MASS %s; script reference/growth_reference.R", R.version.string,
               as.character(packageVersion("MASS")))

simulate <- function(seed, days, a, r, theta = Inf, dowEff = NULL) {
  set.seed(seed)
  eta <- a + r * days
  if (!is.null(dowEff)) eta <- eta + dowEff[(days %% 7) + 1]
  mu <- exp(eta)
  if (is.finite(theta)) rnbinom(length(mu), size = theta, mu = mu) else rpois(length(mu), mu)
}

sets <- list(
  list(name = "pois_growth", days = 0:39, a = 1.0, r = 0.10, theta = Inf, dow = FALSE),
  list(name = "pois_zeros", days = 0:29, a = -0.5, r = 0.08, theta = Inf, dow = FALSE),
  list(name = "pois_decline", days = 5:34, a = 4.0, r = -0.06, theta = Inf, dow = FALSE),
  list(name = "nb_growth", days = 0:34, a = 1.5, r = 0.12, theta = 5, dow = FALSE),
  list(name = "nb_zeros", days = 0:44, a = -0.8, r = 0.07, theta = 2, dow = FALSE),
  list(name = "dow_pois", days = 10:51, a = 1.2, r = 0.05, theta = Inf, dow = TRUE),
  list(name = "dow_nb", days = 3:58, a = 1.0, r = 0.06, theta = 8, dow = TRUE)
)
dowEff <- c(0, 0.1, 0.2, 0.15, 0.05, -0.4, -0.7)

dataRows <- list(); fitRows <- list()
add <- function(set, model, dow, q, v) {
  fitRows[[length(fitRows) + 1]] <<- data.frame(dataset = set, model = model, dow = dow,
                                                quantity = q, value = sprintf("%.17g", v))
}
for (i in seq_along(sets)) {
  s <- sets[[i]]
  y <- simulate(1000 + i, s$days, s$a, s$r, s$theta, if (s$dow) dowEff else NULL)
  d <- data.frame(day = s$days, count = y)
  d$dow <- factor(d$day %% 7)
  dataRows[[i]] <- data.frame(dataset = s$name, day = d$day, count = d$count)
  f <- if (s$dow) count ~ day + dow else count ~ day
  f0 <- if (s$dow) count ~ dow + offset(rr * day) else count ~ 1 + offset(rr * day)
  for (model in if (is.finite(s$theta)) c("poisson", "negbin") else "poisson") {
    if (model == "poisson") {
      fit <- glm(f, family = poisson(link = "log"), data = d,
                 control = glm.control(epsilon = 1e-13, maxit = 200))
      prof <- function(rr) { d$rr <- rr; logLik(glm(f0, family = poisson(), data = cbind(d, rr = rr),
                                                   control = glm.control(epsilon = 1e-13, maxit = 200))) }
    } else {
      fit <- glm.nb(f, data = d, control = glm.control(epsilon = 1e-13, maxit = 200))
      prof <- function(rr) logLik(glm.nb(f0, data = cbind(d, rr = rr),
                                         control = glm.control(epsilon = 1e-13, maxit = 200)))
      add(s$name, model, s$dow, "theta", fit$theta)
      add(s$name, model, s$dow, "theta_se", fit$SE.theta)
    }
    cf <- summary(fit)$coefficients
    for (term in rownames(cf)) {
      add(s$name, model, s$dow, paste0("coef_", term), cf[term, 1])
      add(s$name, model, s$dow, paste0("se_", term), cf[term, 2])
    }
    ll <- as.numeric(logLik(fit))
    add(s$name, model, s$dow, "loglik", ll)
    add(s$name, model, s$dow, "deviance", deviance(fit))
    add(s$name, model, s$dow, "pearson_dispersion",
        sum(residuals(fit, type = "pearson")^2) / df.residual(fit))
    ci <- suppressMessages(confint(fit, "day", level = 0.95))
    add(s$name, model, s$dow, "mass_confint_lower", ci[1])
    add(s$name, model, s$dow, "mass_confint_upper", ci[2])
    rhat <- coef(fit)["day"]; se <- cf["day", 2]
    crit <- qchisq(0.95, 1) / 2
    g <- function(rr) ll - as.numeric(prof(rr)) - crit
    lo <- uniroot(g, c(rhat - 6 * se, rhat), tol = 1e-13)$root
    hi <- uniroot(g, c(rhat, rhat + 6 * se), tol = 1e-13)$root
    add(s$name, model, s$dow, "profile_lower", lo)
    add(s$name, model, s$dow, "profile_upper", hi)
  }
}
writeWith <- function(df, file) {
  con <- file(file.path(out, file), "w")
  writeLines(hdr, con)
  write.csv(df, con, row.names = FALSE, quote = FALSE)
  close(con)
}
writeWith(do.call(rbind, dataRows), "growth_data.csv")
writeWith(do.call(rbind, fitRows), "growth_fits.csv")
