# Builds test/reference/glm/glm-reference.json: reference fits of generalised
# linear models by R's glm (stats) and MASS::glm.nb, MASS::gamma.shape, for
# the tests of src/core/models/glm. Run from the repository root:
#   Rscript scripts/glm-reference.R
# CI does not have R: the tests read the committed JSON, which names the
# versions that made it.
#
# Conventions the reference follows (those of the service, stated in
# src/core/models/glm/conventions.ts):
#  - IRLS to a far tighter tolerance than R's default: glm.control(epsilon =
#    1e-14, maxit = 100), then 20 more restarts from the estimates (polish()):
#    the deviance is flat at its minimum, so under a non-canonical link, where
#    Fisher scoring converges linearly, a deviance rule alone stops short of
#    the maximum by ~1e-8 relative in the estimates.
#  - Full log-likelihoods: R's logLik already includes ln C(m, y) (binomial),
#    -ln y! (Poisson) and every inverse Gaussian constant; the negative
#    binomial's is sum(dnbinom(...)) at the maximum-likelihood theta;
#    for the gamma, R's logLik takes the shape from the deviance (D/n), so the
#    reference is sum(dgamma(...)) at the maximum-likelihood shape of
#    MASS::gamma.shape.
#  - Standard errors with the dispersion the service uses: 1 (binomial,
#    Poisson, negative binomial), 1/shape (gamma, shape by ML), D/n (inverse
#    Gaussian, by ML), RSS/(n - p) (Gaussian), passed to summary(),
#    cooks.distance() and predict().
#
# (MASS::glm.nb, MASS::theta.ml, MASS::negative.binomial and MASS::gamma.shape
# are MASS's; everything else is R's stats package.)
#
# Data: the beetle mortality table of Bliss (1935), "The calculation of the
# dosage-mortality curve", Annals of Applied Biology 22, 134-167 (8 doses of
# carbon disulphide, beetles exposed and killed), as reprinted in many texts;
# every other data set is simulated here from a fixed seed, in scenarios of
# our own (weld seams, valve stations, pump repairs, pressure sensors).
suppressPackageStartupMessages(library(MASS))
CONTROL <- glm.control(epsilon = 1e-14, maxit = 100)
# glm.fit takes at least one step from `start`, so each restart is a further Fisher-scoring step.
polish <- function(fit) {
  for (i in 1:20) fit <- update(fit, start = coef(fit))
  fit
}

arr <- function(x) structure(as.numeric(x), class = "jsonarray")
json <- function(x) {
  if (is.null(x)) return("null")
  if (inherits(x, "jsonarray")) return(paste0("[", paste(vapply(unclass(x), num, ""), collapse = ", "), "]"))
  if (is.list(x)) {
    if (is.null(names(x))) return(paste0("[", paste(vapply(x, json, ""), collapse = ", "), "]"))
    items <- vapply(names(x), function(k) paste0("\"", k, "\": ", json(x[[k]])), "")
    return(paste0("{\n", paste(items, collapse = ",\n"), "\n}"))
  }
  if (is.character(x)) {
    if (length(x) == 1) return(paste0("\"", x, "\""))
    return(paste0("[", paste0("\"", x, "\"", collapse = ", "), "]"))
  }
  if (is.logical(x)) return(if (x) "true" else "false")
  num(x)
}
num <- function(v) if (is.na(v)) "null" else sprintf("%.17g", v)

# Levels in code-point order, as the service codes factors.
codepoint_factor <- function(x) factor(x, levels = sort(unique(x), method = "radix"))

coefficient_table <- function(fit, dispersion, labels) {
  s <- summary(fit, dispersion = dispersion)$coefficients
  lapply(seq_along(labels), function(j) list(term = labels[j], estimate = s[j, 1], standardError = s[j, 2]))
}

case <- function(fit, labels, family, link, data, response, terms, dispersion, logLik, parameter,
                 trials = NULL, offset = NULL, newdata = NULL, newoffset = NULL) {
  k <- fit$rank + (if (is.null(parameter)) 0 else 1)
  out <- list(
    family = family, link = link, response = response, terms = terms,
    trials = trials, offset = offset,
    data = lapply(data, function(col) if (is.numeric(col)) arr(col) else as.character(col)),
    coefficients = coefficient_table(fit, dispersion, labels),
    deviance = fit$deviance, nullDeviance = fit$null.deviance,
    pearsonChiSquare = sum(residuals(fit, "pearson")^2),
    logLikelihood = logLik, parameters = k, aic = -2 * logLik + 2 * k,
    dispersion = dispersion, distributionParameter = parameter,
    leverages = arr(hatvalues(fit)),
    cooksDistances = arr(cooks.distance(fit, dispersion = dispersion)),
    devianceResiduals = arr(residuals(fit, "deviance")),
    pearsonResiduals = arr(residuals(fit, "pearson")),
    # rstandard.glm's form with the service's dispersion: r_D / sqrt(phi (1 - h)).
    standardisedDevianceResiduals = arr(residuals(fit, "deviance") / sqrt(dispersion * (1 - hatvalues(fit)))),
    # Pearson's goodness-of-fit test and the service's overdispersion threshold (upper 5% point of chi2(df)/df).
    pearsonPValue = pchisq(sum(residuals(fit, "pearson")^2), fit$df.residual, lower.tail = FALSE),
    overdispersionThreshold = qchisq(0.95, fit$df.residual) / fit$df.residual
  )
  if (!is.null(newdata)) {
    p <- predict(fit, newdata = newdata, type = "link", se.fit = TRUE, dispersion = dispersion)
    out$prediction <- list(
      rows = lapply(newdata, function(col) if (is.numeric(col)) arr(col) else as.character(col)),
      offset = if (is.null(newoffset)) NULL else arr(newoffset),
      link = arr(p$fit), standardError = arr(p$se.fit),
      # The mean with a 95% interval built on the link scale, ends mapped by the inverse link
      # (z; t on the residual df for the Gaussian family).
      mean = arr(fit$family$linkinv(p$fit)),
      lower = arr(ends(fit, p, -1)), upper = arr(ends(fit, p, 1))
    )
  }
  out
}

ends <- function(fit, p, side) {
  q <- if (fit$family$family == "gaussian") qt(0.975, fit$df.residual) else qnorm(0.975)
  a <- fit$family$linkinv(p$fit - q * p$se.fit)
  b <- fit$family$linkinv(p$fit + q * p$se.fit)
  if (side < 0) pmin(a, b) else pmax(a, b)
}

cases <- list()
tests <- list()

# --- Bliss (1935) beetle mortality, grouped binomial with three links.
beetle <- data.frame(
  dose = c(1.6907, 1.7242, 1.7552, 1.7842, 1.8113, 1.8369, 1.8610, 1.8839),
  exposed = c(59, 60, 62, 56, 63, 59, 62, 60),
  killed = c(6, 13, 18, 28, 52, 53, 61, 60)
)
beetle_new <- data.frame(dose = c(1.70, 1.78, 1.86))
for (link in c("logit", "probit", "cloglog")) {
  fit <- polish(glm(cbind(killed, exposed - killed) ~ dose, family = binomial(link = link), data = beetle, control = CONTROL))
  cases[[paste0("beetle-", link)]] <- case(fit, c("intercept", "dose"), "binomial", link, beetle, "killed", list("dose"),
    1, as.numeric(logLik(fit)), NULL, trials = "exposed", newdata = beetle_new)
}
# A quadratic in dose inside the logit fit: the deviance test R's anova gives.
quad <- polish(glm(cbind(killed, exposed - killed) ~ dose + I(dose^2), family = binomial, data = beetle, control = CONTROL))
line <- polish(glm(cbind(killed, exposed - killed) ~ dose, family = binomial, data = beetle, control = CONTROL))
a <- anova(line, quad, test = "Chisq")
tests[["beetle-logit-lr"]] <- list(smaller = list("dose"), larger = list("dose", list(kind = "power", of = "dose", degree = 2)),
  statistic = a$Deviance[2], df = a$Df[2], pValue = a[["Pr(>Chi)"]][2])
# The same beetles one row each (0/1 response): same coefficients, a
# log-likelihood lower by sum(ln C(exposed, killed)).
each <- data.frame(
  dose = rep(beetle$dose, beetle$exposed),
  dead = unlist(mapply(function(m, y) c(rep(1, y), rep(0, m - y)), beetle$exposed, beetle$killed))
)
fit01 <- polish(glm(dead ~ dose, family = binomial, data = each, control = CONTROL))
cases[["beetle-logit-ungrouped"]] <- list(
  family = "binomial", link = "logit", rows = nrow(each),
  coefficients = coefficient_table(fit01, 1, c("intercept", "dose")),
  logLikelihood = as.numeric(logLik(fit01)), deviance = fit01$deviance,
  sumLogBinomialCoefficients = sum(lchoose(beetle$exposed, beetle$killed))
)

# --- Weld seams: porosity defects per seam, exposure = seam length (m).
set.seed(20240611)
n <- 60
seams <- data.frame(
  length = round(runif(n, 0.5, 4), 2),
  current = round(runif(n, 120, 220)),
  gas = sample(c("argon", "mix", "co2"), n, replace = TRUE)
)
seams$defects <- rpois(n, seams$length * exp(-0.4 + 0.008 * (seams$current - 170) + c(argon = 0, mix = 0.25, co2 = 0.6)[seams$gas]))
seams_f <- transform(seams, gas = codepoint_factor(gas))
seams_new <- data.frame(length = c(1, 2, 3), current = c(130, 170, 210), gas = factor(c("argon", "co2", "mix"), levels = levels(seams_f$gas)))
big <- polish(glm(defects ~ current + gas, offset = log(length), family = poisson, data = seams_f, control = CONTROL))
small <- polish(glm(defects ~ current, offset = log(length), family = poisson, data = seams_f, control = CONTROL))
cases[["seams-poisson-offset"]] <- case(big, c("intercept", "current", "gas=co2", "gas=mix"), "poisson", "log",
  seams, "defects", list("current", "gas"), 1, as.numeric(logLik(big)), NULL,
  offset = "logLength", newdata = seams_new, newoffset = log(c(1, 2, 3)))
cases[["seams-poisson-offset"]]$data$logLength <- arr(log(seams$length))
# The same seams with a cubic in current: the weighted design is ill-conditioned
# enough (condition ~700 after centring) for the service to take the
# least-squares engine's extended covariance route. R is fitted on an
# orthogonal polynomial basis (accurate), so only basis-free quantities are
# compared: deviance, log-likelihood, leverages, Cook's distances, residuals
# and predictions with their standard errors.
cubic <- polish(glm(defects ~ poly(current, 3) + gas, offset = log(length), family = poisson, data = seams_f, control = CONTROL))
cases[["seams-poisson-cubic"]] <- case(cubic, c("intercept", "p1", "p2", "p3", "gas=co2", "gas=mix"), "poisson", "log",
  seams, "defects", list("current", list(kind = "power", of = "current", degree = 2), list(kind = "power", of = "current", degree = 3), "gas"),
  1, as.numeric(logLik(cubic)), NULL, offset = "logLength", newdata = seams_new, newoffset = log(c(1, 2, 3)))
cases[["seams-poisson-cubic"]]$data$logLength <- arr(log(seams$length))
cases[["seams-poisson-cubic"]]$coefficientBasis <- "orthogonal polynomial (not comparable term by term)"
a <- anova(small, big, test = "Chisq")
tests[["seams-poisson-lr"]] <- list(smaller = list("current"), larger = list("current", "gas"),
  statistic = a$Deviance[2], df = a$Df[2], pValue = a[["Pr(>Chi)"]][2])

# --- Valve stations: leak reports per station-year, exposure = valves at the station; overdispersed.
set.seed(20240612)
n <- 80
valves <- data.frame(
  valves = sample(4:40, n, replace = TRUE),
  pressure = round(runif(n, 10, 64)),
  age = round(runif(n, 1, 30), 1)
)
mu <- valves$valves * exp(-3 + 0.02 * valves$pressure + 0.03 * valves$age)
valves$leaks <- rnbinom(n, size = 2.5, mu = mu)
valves$logValves <- log(valves$valves)
# glm.nb alternates theta and IRLS, but asks theta.ml for only eps^(1/4)
# (1.2e-4) in theta, which leaves its theta ~1e-10 from the maximum. The same
# alternation is carried on here, from glm.nb's answer, with
# theta.ml(eps = 1e-12) and 20 Fisher-scoring restarts of
# glm(family = negative.binomial(theta)) at each theta.
nb_alternation <- function(formula) {
  start <- glm.nb(formula, data = valves, control = CONTROL)
  theta <- start$theta
  beta <- coef(start)
  for (i in 1:30) {
    for (j in 1:20) {
      fit <- glm(formula, family = negative.binomial(theta), data = valves, start = beta, control = CONTROL)
      beta <- coef(fit)
    }
    th <- suppressWarnings(theta.ml(valves$leaks, fitted(fit), limit = 100, eps = 1e-12))
    theta <- as.numeric(th)
  }
  fit <- glm(formula, family = negative.binomial(theta), data = valves, start = beta, control = CONTROL)
  list(fit = fit, theta = theta, se = attr(suppressWarnings(theta.ml(valves$leaks, fitted(fit), limit = 100, eps = 1e-12)), "SE"),
    logLik = sum(dnbinom(valves$leaks, size = theta, mu = fitted(fit), log = TRUE)))
}
nb <- nb_alternation(leaks ~ pressure + age + offset(logValves))
nb_small <- nb_alternation(leaks ~ pressure + offset(logValves))
valves_new <- data.frame(pressure = c(16, 40, 60), age = c(5, 15, 25), logValves = log(c(10, 20, 30)))
cases[["valves-negative-binomial"]] <- case(nb$fit, c("intercept", "pressure", "age"), "negativeBinomial", "log",
  valves, "leaks", list("pressure", "age"), 1, nb$logLik,
  list(name = "theta", estimate = nb$theta, standardError = nb$se),
  offset = "logValves", newdata = valves_new, newoffset = valves_new$logValves)
lr <- 2 * (nb$logLik - nb_small$logLik)
tests[["valves-negative-binomial-lr"]] <- list(smaller = list("pressure"), larger = list("pressure", "age"),
  statistic = lr, df = 1, pValue = pchisq(lr, 1, lower.tail = FALSE))

# --- Pump repairs: hours to repair by pump age (years) and site.
set.seed(20240613)
n <- 50
pumps <- data.frame(age = round(runif(n, 0.5, 20), 1), site = sample(c("harbour", "inland", "upland"), n, replace = TRUE))
rate <- 0.5 - 0.015 * pumps$age + c(harbour = 0, inland = 0.1, upland = -0.08)[pumps$site]
pumps$hours <- rgamma(n, shape = 4, rate = 4 * rate)
pumps_f <- transform(pumps, site = codepoint_factor(site))
pumps_new <- data.frame(age = c(2, 10, 18), site = factor(c("harbour", "inland", "upland"), levels = levels(pumps_f$site)))
gamma_labels <- c("intercept", "age", "site=inland", "site=upland")
for (link in c("log", "inverse")) {
  fit <- polish(glm(hours ~ age + site, family = Gamma(link = link), data = pumps_f, control = CONTROL))
  shape <- gamma.shape(fit, it.lim = 100, eps.max = 1e-12)
  ll <- sum(dgamma(pumps$hours, shape = shape$alpha, rate = shape$alpha / fitted(fit), log = TRUE))
  cases[[paste0("pumps-gamma-", link)]] <- case(fit, gamma_labels, "gamma", link, pumps, "hours", list("age", "site"),
    1 / shape$alpha, ll, list(name = "shape", estimate = shape$alpha, standardError = shape$SE), newdata = pumps_new)
  if (link == "log") {
    fit_small <- polish(glm(hours ~ age, family = Gamma(link = "log"), data = pumps_f, control = CONTROL))
    a <- anova(fit_small, fit, test = "F")
    tests[["pumps-gamma-f"]] <- list(smaller = list("age"), larger = list("age", "site"),
      statistic = a$F[2], df = a$Df[2], residualDf = a[["Resid. Df"]][2], pValue = a[["Pr(>F)"]][2])
  }
}
# The same repairs under a Gaussian log link (dispersion RSS/(n - p) for the
# standard errors, sigma^2 = RSS/n by ML in the log-likelihood).
gfit <- polish(glm(hours ~ age + site, family = gaussian(link = "log"), data = pumps_f, control = CONTROL,
  start = coef(glm(hours ~ age + site, family = Gamma(link = "log"), data = pumps_f, control = CONTROL))))
cases[["pumps-gaussian-log"]] <- case(gfit, gamma_labels, "gaussian", "log", pumps, "hours", list("age", "site"),
  gfit$deviance / gfit$df.residual, as.numeric(logLik(gfit)),
  list(name = "dispersion", estimate = gfit$deviance / n, standardError = gfit$deviance / n * sqrt(2 / n)), newdata = pumps_new)

# --- Pressure sensors: days until drift out of tolerance, by operating temperature.
# Inverse Gaussian variates by Michael, Schucany & Haas (1976).
rinvgauss_msh <- function(n, mean, shape) {
  v <- rnorm(n)^2
  x <- mean + mean^2 * v / (2 * shape) - mean / (2 * shape) * sqrt(4 * mean * shape * v + mean^2 * v^2)
  ifelse(runif(n) <= mean / (mean + x), x, mean^2 / x)
}
set.seed(20240614)
n <- 40
sensors <- data.frame(temperature = round(runif(n, 20, 90)))
sensors$days <- round(rinvgauss_msh(n, mean = 1 / sqrt(1e-5 + 2e-7 * sensors$temperature), shape = 800), 2)
sensors_new <- data.frame(temperature = c(25, 55, 85))
for (link in c("1/mu^2", "log")) {
  fit <- polish(glm(days ~ temperature, family = inverse.gaussian(link = link), data = sensors, control = CONTROL,
    start = if (link == "log") c(5, -0.01) else c(1e-5, 2e-7)))
  phi <- fit$deviance / n
  name <- if (link == "log") "log" else "inverseSquare"
  cases[[paste0("sensors-inverse-gaussian-", name)]] <- case(fit, c("intercept", "temperature"), "inverseGaussian", name,
    sensors, "days", list("temperature"), phi, as.numeric(logLik(fit)),
    list(name = "dispersion", estimate = phi, standardError = phi * sqrt(2 / n)), newdata = sensors_new)
  if (link == "log") {
    # Against the intercept-only model: R's F test, dispersion Pearson chi2 / df of the larger model.
    fit0 <- polish(glm(days ~ 1, family = inverse.gaussian(link = "log"), data = sensors, control = CONTROL, start = c(5)))
    a <- anova(fit0, fit, test = "F")
    tests[["sensors-inverse-gaussian-f"]] <- list(smaller = list(), larger = list("temperature"),
      statistic = a$F[2], df = a$Df[2], residualDf = a[["Resid. Df"]][2], pValue = a[["Pr(>F)"]][2])
  }
}

out <- list(
  generatedWith = paste0(R.version.string, "; MASS ", as.character(packageVersion("MASS"))),
  script = "scripts/glm-reference.R",
  control = "glm.control(epsilon = 1e-14, maxit = 100)",
  beetleSource = "Bliss, C. I. (1935). The calculation of the dosage-mortality curve. Annals of Applied Biology 22, 134-167.",
  cases = cases,
  tests = tests
)
dir.create("test/reference/glm", showWarnings = FALSE, recursive = TRUE)
writeLines(json(out), "test/reference/glm/glm-reference.json")
cat("wrote test/reference/glm/glm-reference.json\n")
