# Reference for test/http/nonlinear-comparisons.test.ts: an invented kiln-drying
# data set (boards' moisture content, % of dry mass, over 96 hours) and R's own
# fits of it — nls() for the mechanistic models, lm() for the polynomial —
# with logLik, AIC, BIC, coefficients, standard errors and delta-method
# standard errors of the mean at new hours (deriv() for the gradient, vcov()
# for the covariance). Run: Rscript scripts/make-nonlinear-wire-reference.R >
# test/reference/nonlinear/kiln-drying-r.json
set.seed(1407)
n <- 40
hours <- sort(round(runif(n, 0, 96), 1))
moisture <- round(6 + 36 * exp(-0.045 * hours) + rnorm(n, 0, 0.6), 2)
w <- round(runif(n, 0.5, 2), 2)
d <- data.frame(hours = hours, moisture = moisture, w = w)
at <- data.frame(hours = c(12, 48, 90))

num <- function(x) ifelse(is.na(x), "null", sprintf("%.17g", x))
vec <- function(x) paste0("[", paste(num(x), collapse = ", "), "]")
named <- function(x) paste0("{", paste(sprintf("\"%s\": %s", names(x), num(x)), collapse = ", "), "}")

eqForm <- expression(eq + (m0 - eq) * exp(-k * hours))
deltaSe <- function(fit, form, newdata) {
  g <- attr(eval(deriv(form, names(coef(fit))), c(as.list(coef(fit)), as.list(newdata))), "gradient")
  sqrt(rowSums((g %*% vcov(fit)) * g))
}

describe <- function(fit, extra = "") {
  s <- summary(fit)$coefficients
  sprintf("{ \"logLik\": %s, \"df\": %d, \"aic\": %s, \"bic\": %s, \"coefficients\": %s, \"standardErrors\": %s%s }",
          num(as.numeric(logLik(fit))), attr(logLik(fit), "df"), num(AIC(fit)), num(BIC(fit)),
          named(s[, 1]), named(s[, 2]), extra)
}

start <- list(eq = 5, m0 = 40, k = 0.03)
equilibrium <- nls(moisture ~ eq + (m0 - eq) * exp(-k * hours), d, start = start)
decay <- nls(moisture ~ m0 * exp(-k * hours), d, start = list(m0 = 40, k = 0.03))
quadratic <- lm(moisture ~ hours + I(hours^2), d)
# A model of log(moisture): R's logLik is on the log scale; the density of
# moisture itself gains the Jacobian −Σ ln y (change of variables).
logEquilibrium <- nls(log(moisture) ~ log(eq + (m0 - eq) * exp(-k * hours)), d, start = start)
jacobian <- -sum(log(d$moisture))
wEquilibrium <- nls(moisture ~ eq + (m0 - eq) * exp(-k * hours), d, start = start, weights = w)
wQuadratic <- lm(moisture ~ hours + I(hours^2), d, weights = w)

predictions <- sprintf(", \"predictAt\": %s, \"predictions\": %s, \"predictionStandardErrors\": %s",
                       vec(at$hours), vec(predict(equilibrium, at)), vec(deltaSe(equilibrium, eqForm, at)))

cat("{\n")
cat(sprintf("  \"source\": \"R %s, stats::nls and stats::lm; data invented (set.seed(1407)); scripts/make-nonlinear-wire-reference.R\",\n", getRversion()))
cat(sprintf("  \"data\": { \"hours\": %s, \"moisture\": %s, \"w\": %s },\n", vec(d$hours), vec(d$moisture), vec(d$w)))
cat(sprintf("  \"equilibrium\": %s,\n", describe(equilibrium, predictions)))
cat(sprintf("  \"decay\": %s,\n", describe(decay)))
cat(sprintf("  \"quadratic\": %s,\n", describe(quadratic)))
cat(sprintf("  \"logEquilibrium\": %s,\n", describe(logEquilibrium, sprintf(", \"jacobian\": %s", num(jacobian)))))
cat(sprintf("  \"weightedEquilibrium\": %s,\n", describe(wEquilibrium)))
cat(sprintf("  \"weightedQuadratic\": %s\n", describe(wQuadratic)))
cat("}\n")
