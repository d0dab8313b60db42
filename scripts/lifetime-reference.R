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
