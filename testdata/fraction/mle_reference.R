# Computes maximum-likelihood reference values for the fraction package (fraction.mle in testdata/reference/fraction.json and
# the table in fraction/mle_test.go) from studies.tsv in this folder.
# source: R 4.2.2 (Rscript), stats::glm with family binomial(link = "cloglog"), stats::optimize, stats::uniroot; run as
#   Rscript mle_reference.R > mle_r.tsv   (from this folder)
# Model: P(unit positive at t) = 1 - exp(-N0 10^(-t/D)), i.e. cloglog(P(positive)) = ln N0 + b t with b = -ln(10)/D.
#   N0 fixed:  glm(cbind(pos, neg) ~ 0 + t + offset(rep(log(N0), k)), family = binomial(link = "cloglog"),
#                  start = b0, control = glm.control(epsilon = 1e-15, maxit = 200))
#   N0 fitted: glm(cbind(pos, neg) ~ t, family = binomial(link = "cloglog"), start = c(a0, b0), control = same)
#   The starting values come from stats::optimize of the log-likelihood below (over b, or over b of the profile over ln N0),
#   because glm's cloglog inverse link clamps probabilities to [eps, 1 - eps] and, started from its default, can stop at a
#   point of the clamped likelihood that is not the maximum (it does for study lot-c with N0 fixed).
# Log-likelihood l(a, b) = sum(lchoose(n, pos) + pos log(-expm1(-mu)) - neg mu), mu = exp(a + b t) (no clamping).
# Profile limits on b: uniroot (tol 1e-15) of l_p(b) - (l_p(b_hat) - qchisq(level, 1)/2), l_p(b) = l(ln N0, b) with N0 fixed,
#   or max over a of l(a, b) by optimize (tol 1e-13) with N0 fitted. The upper limit is Inf when l_p(0) is above the threshold.
#   D limits are -ln(10)/b at the b limits. Column loglik_check compares glm's log-likelihood with l at glm's coefficients;
#   where they differ (glm stopped at a point of its clamped likelihood) or optimize found a higher l, the estimate is
#   optimize's (column fit_by), with a relative precision of about 1e-8.
ctl <- glm.control(epsilon = 1e-15, maxit = 200)
fam <- binomial(link = "cloglog")
d <- read.table("studies.tsv", header = TRUE, sep = "\t", comment.char = "#", stringsAsFactors = FALSE)

one <- function(s, fit_n0, level) {
  x <- d[d$study == s, ]
  t <- x$minutes; n <- x$units; neg <- x$negative; pos <- n - neg; k <- length(t)
  log10N0 <- x$log10_n0[1]
  a0 <- log(10^log10N0)
  ll <- function(a, b) {
    mu <- exp(a + b * t)
    sum(lchoose(n, pos) + ifelse(pos > 0, pos * log(-expm1(-mu)), 0) - ifelse(neg > 0, neg * mu, 0))
  }
  amax <- function(b) optimize(function(a) ll(a, b), c(a0 - 60, a0 + 60), maximum = TRUE, tol = 1e-13)
  tm <- max(t)
  if (!fit_n0) {
    lp <- function(b) ll(a0, b)
  } else {
    lp <- function(b) amax(b)$objective
  }
  # coarse start: maximise l_p over log D
  st <- optimize(function(ld) lp(-log(10) / exp(ld)), c(log(tm) - 12, log(tm) + 8), maximum = TRUE, tol = 1e-10)
  b0 <- -log(10) / exp(st$maximum)
  if (!fit_n0) {
    off <- rep(a0, k)
    fit <- glm(cbind(pos, neg) ~ 0 + t + offset(off), family = fam, start = b0, control = ctl)
    b <- coef(fit)[["t"]]; a <- a0
  } else {
    fit <- glm(cbind(pos, neg) ~ t, family = fam, start = c(amax(b0)$maximum, b0), control = ctl)
    a <- coef(fit)[[1]]; b <- coef(fit)[[2]]
  }
  lmax <- as.numeric(logLik(fit))
  dev <- deviance(fit)
  check <- lmax - ll(a, b)
  by <- "glm"
  if (abs(check) > 1e-9 || st$objective > lmax + 1e-9) {
    # glm stopped at a point of its clamped likelihood: use the optimize result (relative precision about 1e-8)
    b <- b0; a <- if (fit_n0) amax(b0)$maximum else a0
    lmax <- ll(a, b); by <- "optimize"
    mu <- exp(a + b * t)
    dev <- 2 * sum(ifelse(pos > 0, pos * (log(pos / n) - log(-expm1(-mu))), 0) + ifelse(neg > 0, neg * (log(neg / n) + mu), 0))
  }
  thr <- lmax - qchisq(level, 1) / 2
  g <- function(bb) lp(bb) - thr
  lo <- uniroot(g, c(b * 20, b), tol = 1e-15, maxiter = 10000)$root
  dup <- Inf
  if (g(0) < 0) dup <- -log(10) / uniroot(g, c(b, 0), tol = 1e-15, maxiter = 10000)$root
  sprintf("%s\t%s\t%.2f\t%.12g\t%.12g\t%.12g\t%.12g\t%.12g\t%.12g\t%s\t%.3g\t%s", s, ifelse(fit_n0, "true", "false"), level,
          -log(10) / b, -log(10) / lo, dup, a / log(10), dev, lmax, fit$converged, check, by)
}

cat("# Maximum-likelihood reference values for the studies of studies.tsv (same folder).\n")
cat("# source: ", R.version.string, ", script mle_reference.R in this folder (glm binomial cloglog; profile limits by uniroot)\n", sep = "")
cat("# columns (tab-separated): study, fit_n0, level, d, d_lower, d_upper, log10_n0, deviance, log_likelihood, glm_converged, loglik_check, fit_by\n")
cat("# units: d and its limits in minutes; log10_n0 = log10 spores per unit (fitted with fit_n0, else the given one); deviance against\n")
cat("#   the saturated model; log_likelihood with binomial coefficients; loglik_check = logLik(glm) - l(a, b) at glm's coefficients;\n")
cat("#   glm_converged is FALSE where the deviance change stalls at round-off above glm's criterion (epsilon 1e-15); optimize (the start)\n")
cat("#   found no higher log-likelihood there (the script switches to optimize when it does)\n")
cat("#   fit_by = glm, or optimize where glm stopped at a point of its clamped likelihood (then values are from optimize, relative precision ~1e-8)\n")
cat("study\tfit_n0\tlevel\td\td_lower\td_upper\tlog10_n0\tdeviance\tlog_likelihood\tglm_converged\tloglik_check\tfit_by\n")
runs <- list(
  list("lot-a", FALSE, 0.95), list("lot-a", TRUE, 0.95), list("lot-a", FALSE, 0.90), list("lot-a", TRUE, 0.99),
  list("lot-b", FALSE, 0.95), list("lot-b", TRUE, 0.95),
  list("lot-c", FALSE, 0.95), list("lot-c", TRUE, 0.95),
  list("high-n0", FALSE, 0.95), list("high-n0", TRUE, 0.95),
  list("low-n0", FALSE, 0.95), list("low-n0", TRUE, 0.95),
  list("seconds", FALSE, 0.95), list("seconds", TRUE, 0.95),
  list("days", FALSE, 0.95), list("days", TRUE, 0.95),
  list("one-fractional", FALSE, 0.95), list("step", FALSE, 0.95), list("unbounded", FALSE, 0.95))
for (r in runs) cat(one(r[[1]], r[[2]], r[[3]]), "\n", sep = "")
