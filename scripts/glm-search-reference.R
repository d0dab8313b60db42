# Builds test/reference/glm/glm-search-reference.json: every subset of a
# small pool fitted by R's glm (stats; MASS::gamma.shape for the gamma's
# maximum-likelihood shape), with the log-likelihood, k, AIC, BIC and the
# coefficients of each, for the tests of generalised-linear searches
# (test/core/search/glm-search-reference.test.ts). Run from the repository root:
#   Rscript scripts/glm-search-reference.R
# CI does not have R: the tests read the committed JSON, which names the
# versions that made it.
#
# Conventions followed (the service's, src/core/models/glm/conventions.ts):
# full log-likelihoods (R's logLik includes ln C(m, y) and -ln y!); the gamma
# scored at its maximum-likelihood shape, counted in k; IRLS to a tolerance
# far tighter than R's default, then polished by restarts (as
# scripts/glm-reference.R does), so the reference is the maximum itself.
#
# Data: simulated here from a fixed seed, in the demo's ceramic-tile scenario
# (invented): defects per pallet of tiles (Poisson, log of tiles inspected as
# offset), cracked tiles out of those tested per firing batch (binomial with
# trials), and the breaking strength of single tiles (gamma, log link).
suppressPackageStartupMessages(library(MASS))
CONTROL <- glm.control(epsilon = 1e-14, maxit = 100)
# glm.fit takes at least one step from `start`, so each restart is a further Fisher-scoring step.
polished_glm <- function(f, family, data) {
  fit <- glm(f, family = family, data = data, control = CONTROL)
  for (i in 1:20) fit <- glm(f, family = family, data = data, control = CONTROL, start = coef(fit))
  fit
}

num <- function(v) if (is.na(v)) "null" else sprintf("%.17g", v)
arr <- function(x) paste0("[", paste(vapply(as.numeric(x), num, ""), collapse = ", "), "]")
strs <- function(x) paste0("[", paste0("\"", x, "\"", collapse = ", "), "]")
column <- function(x) if (is.numeric(x)) arr(x) else strs(as.character(x))
obj <- function(items) paste0("{", paste(q(names(items)), items, sep = ": ", collapse = ", "), "}")
q <- function(s) paste0("\"", s, "\"")

# Levels in code-point order, as the service codes factors.
codepoint_factor <- function(x) factor(x, levels = sort(unique(x), method = "radix"))

# pool: R formula pieces, in pool order; the service's terms are in the test.
every_subset <- function(name, data, response_lhs, pool, family, link, scored_k_extra, loglik, offset = NULL, trials = NULL) {
  m <- length(pool)
  rows <- character(0)
  for (mask in 0:(2^m - 1)) {
    held <- which(bitwAnd(mask, 2^(0:(m - 1))) > 0)
    rhs <- if (length(held) == 0) "1" else paste(pool[held], collapse = " + ")
    if (!is.null(offset)) rhs <- paste0(rhs, " + offset(", offset, ")")
    f <- as.formula(paste(response_lhs, "~", rhs))
    fit <- polished_glm(f, family, data)
    ll <- loglik(fit)
    k <- fit$rank + scored_k_extra
    n <- nrow(data)
    rows <- c(rows, obj(list(
      pool = paste0("[", paste(held - 1, collapse = ", "), "]"),
      logLikelihood = num(ll), parameters = num(k),
      aic = num(-2 * ll + 2 * k), bic = num(-2 * ll + log(n) * k),
      aicc = num(-2 * ll + 2 * k + 2 * k * (k + 1) / (n - k - 1)),
      deviance = num(fit$deviance), coefficients = arr(coef(fit))
    )))
  }
  cols <- vapply(names(data), function(c) paste0(q(c), ": ", column(data[[c]])), "")
  paste0(q(name), ": {\n",
    "\"family\": ", q(family$family), ", \"link\": ", q(link), ",\n",
    "\"offset\": ", if (is.null(offset)) "null" else q(offset), ", \"trials\": ", if (is.null(trials)) "null" else q(trials), ",\n",
    "\"columns\": {", paste(cols, collapse = ",\n"), "},\n",
    "\"subsets\": [\n", paste(rows, collapse = ",\n"), "\n]}")
}

set.seed(20261202)

# Defects found per pallet, by firing conditions; tiles inspected per pallet as exposure.
n <- 60
pallets <- data.frame(
  peakTemp = round(runif(n, 1150, 1250)),
  holdMinutes = round(runif(n, 20, 60)),
  moisture = round(runif(n, 4, 8), 1),
  glazeMicrons = round(runif(n, 200, 400)),
  kiln = sample(c("east", "west"), n, replace = TRUE),
  tiles = sample(200:600, n, replace = TRUE)
)
pallets$logTiles <- log(pallets$tiles)
eta <- pallets$logTiles - 4 + 0.012 * (pallets$peakTemp - 1200) + 0.25 * (pallets$moisture - 6) + 0.3 * (pallets$kiln == "west")
pallets$defects <- rpois(n, exp(eta))
pallets_fit <- pallets
pallets_fit$kiln <- codepoint_factor(pallets$kiln)
poisson_ll <- function(fit) as.numeric(logLik(fit))
defects <- every_subset("defects", pallets_fit, "defects", c("peakTemp", "holdMinutes", "moisture", "glazeMicrons", "kiln"),
  poisson(link = "log"), "log", 0, poisson_ll, offset = "logTiles")
defects <- sub("\"kiln\": \\[[^]]*\\]", paste0("\"kiln\": ", strs(pallets$kiln)), defects)

# Cracked tiles out of those tested, per firing batch.
n <- 40
batches <- data.frame(
  peakTemp = round(runif(n, 1150, 1250)),
  moisture = round(runif(n, 4, 8), 1),
  holdMinutes = round(runif(n, 20, 60)),
  glazeMicrons = round(runif(n, 200, 400)),
  tested = sample(20:50, n, replace = TRUE)
)
p <- plogis(-1.5 + 0.03 * (batches$peakTemp - 1200) - 0.4 * (batches$moisture - 6))
batches$cracked <- rbinom(n, batches$tested, p)
cracks <- every_subset("cracks", batches, "cbind(cracked, tested - cracked)", c("peakTemp", "moisture", "holdMinutes", "glazeMicrons"),
  binomial(link = "logit"), "logit", 0, function(fit) as.numeric(logLik(fit)), trials = "tested")

# Breaking strength of single tiles (N/mm²), gamma with a log link; the shape by maximum likelihood (MASS::gamma.shape), counted in k.
n <- 50
tiles <- data.frame(
  peakTemp = round(runif(n, 1150, 1250)),
  moisture = round(runif(n, 4, 8), 1),
  holdMinutes = round(runif(n, 20, 60))
)
mu <- exp(3.5 + 0.004 * (tiles$peakTemp - 1200) - 0.05 * (tiles$moisture - 6))
tiles$strength <- round(rgamma(n, shape = 8, rate = 8 / mu), 3)
gamma_ll <- function(fit) {
  shape <- MASS::gamma.shape(fit, it.lim = 100, eps.max = 1e-12)$alpha
  sum(dgamma(tiles$strength, shape = shape, rate = shape / fitted(fit), log = TRUE))
}
strength <- every_subset("strength", tiles, "strength", c("peakTemp", "moisture", "holdMinutes"),
  Gamma(link = "log"), "log", 1, gamma_ll)

out <- paste0("{\n\"source\": ", q(paste0(R.version.string, "; MASS ", packageVersion("MASS"), "; scripts/glm-search-reference.R")), ",\n",
  defects, ",\n", cracks, ",\n", strength, "\n}\n")
writeLines(out, "test/reference/glm/glm-search-reference.json")
