# Reference values from R's nls (package stats) for the nonlinear engine,
# written to test/reference/nonlinear/r-nls.json for
# test/core/models/nonlinear/r-nls.test.ts:
#   - estimates, standard errors, logLik, AIC and BIC of nls fits: R's
#     logLik.nls is the full Gaussian maximum-likelihood value with every
#     constant (and, with weights, + sum(log w)/2), and AIC/BIC count the
#     error variance in k, the service's convention;
#   - anova() of a nested pair: the extra-sum-of-squares F test;
#   - a weighted fit;
#   - anova() of pairs that mix kinds, which the service tests on the caller's
#     word (options.tests): a nonlinear model nested in a linear one (a
#     parabola with its vertex on zero, c (hours - h)^2, inside the quadratic;
#     R's anova wants both as nls fits, so the quadratic is fitted by nls too,
#     and its deviance equals lm's), and a linear model nested in a model
#     linear in its parameters but written as an expression (lm against lm).
# Scenario (our own): boards drying in a kiln, moisture content (% of dry
# mass) against hours; a first-order approach to an equilibrium moisture, and
# the same with the equilibrium fixed at 0 (the nested, smaller model).
#
# Run: Rscript scripts/nonlinear-r-fixtures.R
set.seed(20240611)
hours <- sort(round(runif(30, 0, 96), 1))
truth <- c(equilibrium = 8, initial = 42, rate = 0.045)
moisture <- truth[["equilibrium"]] + (truth[["initial"]] - truth[["equilibrium"]]) * exp(-truth[["rate"]] * hours) +
  rnorm(30, 0, 0.6)
moisture <- round(moisture, 2)
# Relative weights: later readings from a finer balance.
weight <- round(ifelse(hours > 48, 2, 1) * runif(30, 0.8, 1.2), 3)
drying <- data.frame(hours, moisture, weight)

ctl <- nls.control(tol = 1e-8, maxiter = 200, minFactor = 1e-10)
larger <- nls(moisture ~ equilibrium + (initial - equilibrium) * exp(-rate * hours), drying,
              start = list(equilibrium = 5, initial = 40, rate = 0.03), control = ctl)
smaller <- nls(moisture ~ initial * exp(-rate * hours), drying,
               start = list(initial = 40, rate = 0.03), control = ctl)
weighted <- nls(moisture ~ equilibrium + (initial - equilibrium) * exp(-rate * hours), drying,
                start = list(equilibrium = 5, initial = 40, rate = 0.03), weights = weight, control = ctl)
test <- anova(smaller, larger)
vertex <- nls(moisture ~ curvature * (hours - floor)^2, drying,
              start = list(curvature = 0.004, floor = 120), control = ctl)
quadratic_nls <- nls(moisture ~ b0 + b1 * hours + b2 * hours^2, drying,
                     start = list(b0 = 40, b1 = -0.5, b2 = 0.003), control = ctl)
quadratic_lm <- lm(moisture ~ hours + I(hours^2), drying)
line <- lm(moisture ~ hours, drying)
mixed <- list(
  list(smaller = "vertex", larger = "quadratic", table = anova(vertex, quadratic_nls),
       rss = c(deviance(vertex), deviance(quadratic_lm))),
  list(smaller = "line", larger = "quadratic-expression", table = anova(line, quadratic_lm),
       rss = c(deviance(line), deviance(quadratic_lm))))

num <- function(x) paste0("[", paste(formatC(x, digits = 17, format = "g"), collapse = ", "), "]")
one <- function(x) formatC(x, digits = 17, format = "g")
describe <- function(name, fit, expression, start) {
  s <- summary(fit)
  paste0('  "', name, '": {\n',
         '   "expression": "', expression, '",\n',
         '   "start": ', start, ',\n',
         '   "estimates": ', num(coef(fit)), ',\n',
         '   "standardErrors": ', num(s$coefficients[, 2]), ',\n',
         '   "rss": ', one(deviance(fit)), ',\n',
         '   "logLik": ', one(as.numeric(logLik(fit))), ',\n',
         '   "df": ', attr(logLik(fit), "df"), ',\n',
         '   "aic": ', one(AIC(fit)), ',\n',
         '   "bic": ', one(BIC(fit)), '\n',
         '  }')
}
out <- paste0('{\n',
  ' "source": "scripts/nonlinear-r-fixtures.R",\n',
  ' "versions": { "R": "', R.version.string, '" },\n',
  ' "data": { "hours": ', num(hours), ', "moisture": ', num(moisture), ', "weight": ', num(weight), ' },\n',
  ' "fits": {\n',
  describe("larger", larger, "equilibrium + (initial - equilibrium)*exp(-rate*hours)", '{ "equilibrium": 5, "initial": 40, "rate": 0.03 }'), ',\n',
  describe("smaller", smaller, "initial*exp(-rate*hours)", '{ "initial": 40, "rate": 0.03 }'), ',\n',
  describe("weighted", weighted, "equilibrium + (initial - equilibrium)*exp(-rate*hours)", '{ "equilibrium": 5, "initial": 40, "rate": 0.03 }'), '\n',
  ' },\n',
  ' "anova": { "df": ', test$Df[2], ', "residualDf": ', test$`Res.Df`[2], ', "F": ', one(test$`F value`[2]), ', "p": ', one(test$`Pr(>F)`[2]), ' },\n',
  ' "mixedPairs": {\n',
  '  "vertex": { "expression": "curvature*(hours - floor)^2", "start": { "curvature": 0.004, "floor": 120 } },\n',
  '  "quadratic": { "terms": ["hours", "hours^2"] },\n',
  '  "line": { "terms": ["hours"] },\n',
  '  "quadratic-expression": { "expression": "b0 + b1*hours + b2*hours^2", "start": { "b0": 40, "b1": -0.5, "b2": 0.003 } },\n',
  '  "anova": [\n',
  paste(vapply(mixed, function(m) {
    tab <- m$table  # columns 5 and 6: F and Pr(>F) (named "F value" for nls, "F" for lm)
    paste0('   { "smaller": "', m$smaller, '", "larger": "', m$larger, '", "df": ', tab$Df[2],
           ', "residualDf": ', tab[2, 1], ', "rss": ', num(m$rss),
           ', "F": ', one(tab[2, 5]), ', "p": ', one(tab[2, 6]), ' }')
  }, ""), collapse = ',\n'), '\n',
  '  ]\n',
  ' }\n',
  '}\n')
target <- file.path(dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE))), "..", "test", "reference", "nonlinear", "r-nls.json")
writeLines(out, target, sep = "")
cat("wrote", normalizePath(target), "\n")
