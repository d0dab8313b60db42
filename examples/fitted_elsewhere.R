# Send residuals of a model fitted with lm() and let the service score it
# beside models it fits itself. Needs httr2 and jsonlite.
#   Sys.setenv(PARSIMETRY_URL = "http://127.0.0.1:8080"); source("examples/fitted_elsewhere.R")
library(httr2)
library(jsonlite)

url <- Sys.getenv("PARSIMETRY_URL", "http://127.0.0.1:8080")
tiles <- read.csv("examples/tiles.csv")

fit <- lm(shrinkage ~ peakTemp + moisture, data = tiles)
k <- length(coef(fit)) + 1  # coefficients plus the error variance

body <- list(
  label = "R lm residuals versus service fits",
  data = list(columns = list(
    peakTemp = tiles$peakTemp, moisture = tiles$moisture,
    kiln = tiles$kiln, shrinkage = tiles$shrinkage
  )),
  response = "shrinkage",
  candidates = list(
    list(name = "lm-temperature-moisture", residuals = unname(residuals(fit)), parameters = k),
    list(name = "with-kiln", terms = list("peakTemp", "moisture", "kiln"))
  )
)

result <- request(paste0(url, "/v1/comparisons")) |>
  req_body_json(body, auto_unbox = TRUE, digits = NA) |>
  req_perform() |>
  resp_body_json()

ranking <- result$rankings[[result$conventions$rankBy]]
for (entry in ranking) {
  cat(sprintf("%d  %-26s delta=%.3f  weight=%.4f\n", entry$rank, entry$name, entry$delta, entry$weight))
}
cat(result$verdict$summary, "\n")
