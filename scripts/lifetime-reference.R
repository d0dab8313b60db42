# Builds the R survival fixtures under test/reference/lifetime/ for the
# lifetime kind: Rscript scripts/lifetime-reference.R (after
# scripts/lifetime-reference.py, which writes solder-joints.csv).
# - survreg-aft.json: survival::survreg fits of the accelerated-failure-time
#   model cycles ~ 1/kelvin + finish + load for the seven families survreg
#   has (all but the gamma), on the mixed right/left/interval data
#   (Surv(type = "interval2")) and on the exact/right-censored version; and
#   intercept-only fits of the ball-bearing data (Lieblein & Zelen 1956) for
#   standard errors. Tight convergence (rel.tolerance 1e-13).
# - survfit-nonparametric.json: survival::survfit Kaplan–Meier with
#   conf.type = "log-log" on the exact/right-censored data, and the
#   interval-censored (Turnbull) estimate on the mixed data and on the
#   overlapping inspection windows of seal-inspections.csv.
library(survival)
out_dir <- file.path(dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE))), "..", "test", "reference", "lifetime")
d <- read.csv(file.path(out_dir, "solder-joints.csv"), stringsAsFactors = FALSE)
d$finish <- factor(d$finish, levels = c("matte", "gloss"))
t1 <- ifelse(d$status == "left", NA, d$cycles)
t2 <- ifelse(d$status == "right", NA, ifelse(d$status == "interval", d$upper, d$cycles))
bearings <- c(17.88, 28.92, 33.00, 41.52, 42.12, 45.60, 48.48, 51.84, 51.96, 54.12, 55.56, 67.80,
              68.64, 68.64, 68.88, 84.12, 93.12, 98.64, 105.12, 105.84, 127.92, 128.04, 173.40)

num <- function(x) ifelse(is.na(x), "null", sprintf("%.17g", x))
vec <- function(x) paste0("[", paste(num(x), collapse = ", "), "]")
obj <- function(...) {
  kv <- list(...)
  paste0("{", paste(sprintf("\"%s\": %s", names(kv), unlist(kv)), collapse = ", "), "}")
}
str <- function(s) sprintf("\"%s\"", s)
families <- c(exponential = "exponential", weibull = "weibull", lognormal = "lognormal", loglogistic = "loglogistic",
              normal = "gaussian", logistic = "logistic", smallestExtremeValue = "extreme")
control <- survreg.control(rel.tolerance = 1e-13, maxiter = 200)
fit_json <- function(f) {
  v <- vcov(f)
  obj(coefficients = vec(coef(f)), scale = num(f$scale), logLikelihood = num(f$loglik[2]),
      standardErrors = vec(sqrt(diag(v))), iterations = num(f$iter),
      covariance = paste0("[", paste(apply(v, 1, vec), collapse = ", "), "]"))
}
fits <- function(make) paste0("{", paste(sprintf("\"%s\": %s", names(families), sapply(families, function(fam) fit_json(make(fam)))), collapse = ", "), "}")
mixed <- fits(function(fam) survreg(Surv(t1, t2, type = "interval2") ~ I(1 / kelvin) + finish + load, data = d, dist = fam, control = control))
right <- fits(function(fam) survreg(Surv(rightOnlyCycles, rightOnlyStatus == "exact") ~ I(1 / kelvin) + finish + load, data = d, dist = fam, control = control))
bear <- fits(function(fam) survreg(Surv(bearings) ~ 1, dist = fam, control = control))
versions <- obj(R = str(R.version$version.string), survival = str(as.character(packageVersion("survival"))))
writeLines(paste0("{\n \"source\": \"survival::survreg, formula ~ I(1/kelvin) + finish (reference matte) + load; coefficients on log-time (time for normal, logistic, extreme); scale is sigma; logLikelihood is survreg's loglik[2]\",\n",
                  " \"versions\": ", versions, ",\n \"terms\": [\"intercept\", \"1/kelvin\", \"finish=gloss\", \"load\"],\n",
                  " \"mixed\": ", mixed, ",\n \"right\": ", right, ",\n \"bearings\": ", bear, "\n}"),
           file.path(out_dir, "survreg-aft.json"))

km <- survfit(Surv(rightOnlyCycles, rightOnlyStatus == "exact") ~ 1, data = d, conf.type = "log-log")
k <- km$n.event > 0
tb <- survfit(Surv(t1, t2, type = "interval2") ~ 1, data = d)
seals <- read.csv(file.path(out_dir, "seal-inspections.csv"), stringsAsFactors = FALSE)
s1 <- ifelse(seals$status == "left", NA, seals$day)
s2 <- ifelse(seals$status == "right", NA, ifelse(seals$status == "interval", seals$upper, seals$day))
sb <- survfit(Surv(s1, s2, type = "interval2") ~ 1)
writeLines(paste0("{\n \"source\": \"survival::survfit: Kaplan-Meier (conf.type log-log, std.err of -log S) on rightOnlyCycles; interval-censored (Turnbull) estimate on the mixed data\",\n",
                  " \"versions\": ", versions, ",\n",
                  " \"kaplanMeier\": ", obj(time = vec(km$time[k]), atRisk = vec(km$n.risk[k]), failures = vec(km$n.event[k]), survival = vec(km$surv[k]),
                                           logStandardError = vec(km$std.err[k]), lower = vec(km$lower[k]), upper = vec(km$upper[k])), ",\n",
                  " \"turnbull\": ", obj(time = vec(tb$time), survival = vec(tb$surv)), ",\n",
                  " \"sealsTurnbull\": ", obj(time = vec(sb$time), survival = vec(sb$surv)), "\n}"),
           file.path(out_dir, "survfit-nonparametric.json"))
cat("wrote", out_dir, "\n")

# survreg-predictions.json: values at stated reference rows of the mixed-data
# fits (and of the intercept-only bearing fits), for life predictions:
# - the location (linear predictor) with its standard error (predict type "lp");
# - percentiles on the log scale (predict type "uquantile", se.fit), the
#   interval exp(uq -/+ z se) at 95%;
# - survival probabilities S(t) at given times with the delta method on the
#   standardised deviate z = (ln t - lp)/scale, gradient (-x/scale, -z) in
#   (coefficients, log scale) against vcov(fit), the interval S(z + q se),
#   S(z - q se); written out here, survreg has no survival predictions.
rows <- data.frame(kelvin = c(358.15, 398.15), finish = factor(c("gloss", "matte"), levels = c("matte", "gloss")), load = c(1.0, 1.5))
surv_law <- list(weibull = function(z) exp(-exp(z)), lognormal = function(z) pnorm(-z), loglogistic = function(z) plogis(-z))
q <- qnorm(0.975)
probabilities <- c(0.1, 0.5)
times <- c(500, 1000, 2000)
predict_json <- function(f, fam, newdata, x, times) {
  lp <- predict(f, newdata = newdata, type = "lp", se.fit = TRUE)
  uq <- predict(f, newdata = newdata, type = "uquantile", p = probabilities, se.fit = TRUE)
  uq_fit <- matrix(uq$fit, nrow = nrow(x))
  uq_se <- matrix(uq$se.fit, nrow = nrow(x))
  v <- vcov(f)
  per_row <- sapply(seq_len(nrow(x)), function(i) {
    z <- (log(times) - lp$fit[i]) / f$scale
    se <- sapply(z, function(zz) { g <- c(-x[i, ] / f$scale, -zz); sqrt(drop(t(g) %*% v %*% g)) })
    obj(location = num(lp$fit[i]), locationSE = num(lp$se.fit[i]),
        percentile = vec(exp(uq_fit[i, ])), percentileLower = vec(exp(uq_fit[i, ] - q * uq_se[i, ])), percentileUpper = vec(exp(uq_fit[i, ] + q * uq_se[i, ])),
        survival = vec(surv_law[[fam]](z)), survivalLower = vec(surv_law[[fam]](z + q * se)), survivalUpper = vec(surv_law[[fam]](z - q * se)))
  })
  paste0("[", paste(per_row, collapse = ", "), "]")
}
x_rows <- cbind(1, 1 / rows$kelvin, as.numeric(rows$finish == "gloss"), rows$load)
aft <- sapply(names(surv_law), function(fam) {
  f <- survreg(Surv(t1, t2, type = "interval2") ~ I(1 / kelvin) + finish + load, data = d, dist = fam, control = control)
  predict_json(f, fam, rows, x_rows, times)
})
plain <- sapply(names(surv_law), function(fam) {
  f <- survreg(Surv(bearings) ~ 1, dist = fam, control = control)
  predict_json(f, fam, data.frame(one = 1), matrix(1, 1, 1), c(25, 50, 100))
})
writeLines(paste0("{\n \"source\": \"survival::survreg fits of survreg-aft.json (mixed data) and of the bearings; location and percentiles by predict(type = lp / uquantile, se.fit = TRUE), 95% intervals exp(uq -/+ 1.959964 se); survival by the delta method on the standardised deviate against vcov(fit), written in this script\",\n",
                  " \"versions\": ", versions, ",\n",
                  " \"rows\": ", obj(kelvin = vec(rows$kelvin), finish = paste0("[", paste(str(as.character(rows$finish)), collapse = ", "), "]"), load = vec(rows$load)), ",\n",
                  " \"probabilities\": ", vec(probabilities), ", \"times\": ", vec(times), ", \"bearingTimes\": ", vec(c(25, 50, 100)), ",\n",
                  " \"aft\": {", paste(sprintf("\"%s\": %s", names(aft), aft), collapse = ", "), "},\n",
                  " \"bearings\": {", paste(sprintf("\"%s\": %s", names(plain), plain), collapse = ", "), "}\n}"),
           file.path(out_dir, "survreg-predictions.json"))
cat("wrote survreg-predictions.json\n")
