# Reference fixtures for compfit's regression engine, computed by R's lm/predict.lm on
# modeldata::ames (De Cock's Ames housing data), so CI can check the engine against R
# without having R installed.
#
# Run from the repository root:
#     Rscript test/reference/ames-reference.R
# Needs only base R and the modeldata package (Debian: r-base-core r-cran-modeldata).
#
# Writes, for every case in CASES below, into test/fixtures/ames/:
#   <case>.sales.csv      the sales of one neighbourhood in compfit's sales CSV format
#                         (DESIGN.md "CSV of sales", columns in CSV_COLUMNS order)
#   <case>.expected.json  R's fit, diagnostics, leave-one-out ratio study and subject
#                         intervals for that case, numbers printed with 17 significant digits
# test/fixtures/ames/README.md describes every field.
#
# Definitions follow DESIGN.md "Statistics": age = year of sale - year_built;
# months_since_sale = days from sale date to the effective date / 30.4375;
# bathrooms = full baths + 0.5 * half baths.

suppressPackageStartupMessages(library(modeldata))
data("ames", package = "modeldata", envir = environment())

if (!dir.exists(file.path("test", "reference")))
  stop("run this from the repository root: Rscript test/reference/ames-reference.R")
OUT_DIR <- file.path("test", "fixtures", "ames")
dir.create(OUT_DIR, recursive = TRUE, showWarnings = FALSE)

SOURCE <- sprintf("R %s lm/predict.lm on modeldata::ames", getRversion())
LEVELS <- c(0.95, 0.8)
# After the last sale in the data (2010-07-15), so no sale postdates a subject's date.
DEFAULT_EFFECTIVE_DATE <- "2010-08-01"

# Our predictor name -> the column or term R uses in the formula.
R_TERM <- c(
  living_area = "Gr_Liv_Area",
  "living_area^2" = "I(Gr_Liv_Area^2)",
  age = "age",
  rooms = "TotRms_AbvGrd",
  bedrooms = "Bedroom_AbvGr",
  bathrooms = "bathrooms",
  lot_area = "Lot_Area",
  garage_spaces = "Garage_Cars",
  months_since_sale = "months_since_sale"
)

# ---------------------------------------------------------------------------------------
# Cases. Subjects give the values of the case's predictors; other characteristics are
# filled with the neighbourhood's medians. Every subject is checked below against its
# intended role: "central" inside every range with leverage under the 2p/n high-leverage
# mark (months_since_sale = 0 sits at the edge of its range by construction),
# "large-area" above the largest living area, "hidden-extrapolation" inside every range
# with leverage above the largest leverage among the sales.
# ---------------------------------------------------------------------------------------
CASES <- list(
  list(
    case = "crawford-linear", neighborhood = "Crawford", transform = "none",
    predictors = c("living_area", "age", "rooms", "bathrooms"),
    subjects = list(
      central = list(living_area = 1650, age = 69, rooms = 7, bathrooms = 2),
      "large-area" = list(living_area = 3900, age = 69, rooms = 7, bathrooms = 2),
      "hidden-extrapolation" = list(living_area = 2600, age = 80, rooms = 6, bathrooms = 1)
    )
  ),
  list(
    case = "northwest-ames-linear", neighborhood = "Northwest_Ames", transform = "none",
    predictors = c("living_area", "age", "rooms"),
    subjects = list(
      central = list(living_area = 1630, age = 32, rooms = 7),
      "large-area" = list(living_area = 3300, age = 32, rooms = 7),
      "hidden-extrapolation" = list(living_area = 2500, age = 40, rooms = 5)
    )
  ),
  list(
    case = "crawford-log", neighborhood = "Crawford", transform = "log",
    predictors = c("living_area", "age", "bathrooms", "garage_spaces"),
    subjects = list(
      central = list(living_area = 1650, age = 69, bathrooms = 2, garage_spaces = 2),
      "large-area" = list(living_area = 3900, age = 69, bathrooms = 2, garage_spaces = 2),
      "hidden-extrapolation" = list(living_area = 2800, age = 85, bathrooms = 1, garage_spaces = 1)
    )
  ),
  list(
    case = "northwest-ames-quadratic", neighborhood = "Northwest_Ames", transform = "none",
    predictors = c("living_area", "living_area^2", "age"),
    subjects = list(
      central = list(living_area = 1630, age = 32),
      "large-area" = list(living_area = 3300, age = 32),
      "hidden-extrapolation" = list(living_area = 2800, age = 9)
    )
  ),
  # The effective date is the neighbourhood's last sale date, so the subject's
  # months_since_sale of 0 is the smallest value among the sales, not outside their range.
  list(
    case = "brookside-months", neighborhood = "Brookside", transform = "none",
    predictors = c("living_area", "age", "months_since_sale"),
    effective_date = "last-sale",
    subjects = list(
      central = list(living_area = 1230, age = 76),
      "large-area" = list(living_area = 2600, age = 76),
      "hidden-extrapolation" = list(living_area = 1980, age = 37)
    )
  )
)

# ---------------------------------------------------------------------------------------
# Sales
# ---------------------------------------------------------------------------------------
all_sales <- as.data.frame(ames)
all_sales$row <- seq_len(nrow(all_sales))
all_sales$age <- all_sales$Year_Sold - all_sales$Year_Built
all_sales$bathrooms <- all_sales$Full_Bath + 0.5 * all_sales$Half_Bath
all_sales$sale_date <- sprintf("%04d-%02d-15", all_sales$Year_Sold, all_sales$Mo_Sold)
CSV_SOURCE <- c(
  sale_price = "Sale_Price", living_area = "Gr_Liv_Area", year_built = "Year_Built",
  rooms = "TotRms_AbvGrd", bedrooms = "Bedroom_AbvGr", bathrooms = "bathrooms",
  lot_area = "Lot_Area", garage_spaces = "Garage_Cars"
)

neighborhood_sales <- function(neighborhood) {
  d <- all_sales[all_sales$Neighborhood == neighborhood, ]
  d <- d[complete.cases(d[, c(CSV_SOURCE, "Year_Sold", "Mo_Sold")]), ]
  d <- d[d$Year_Built <= d$Year_Sold, ]
  stopifnot(nrow(d) >= 50, nrow(d) <= 200)
  d$id <- paste0("ames-", d$row)
  d$address <- paste("Ames row", d$row)
  rownames(d) <- NULL
  d
}

csv_number <- function(x) {
  stopifnot(all(is.finite(x)))
  sprintf("%.15g", as.numeric(x))
}

# Column order of CSV_COLUMNS in src/domain/sales-csv.ts.
write_sales_csv <- function(d, path) {
  cols <- list(
    id = d$id, address = d$address, sale_date = d$sale_date,
    sale_price = csv_number(d$Sale_Price), living_area = csv_number(d$Gr_Liv_Area),
    year_built = csv_number(d$Year_Built), rooms = csv_number(d$TotRms_AbvGrd),
    bedrooms = csv_number(d$Bedroom_AbvGr), bathrooms = csv_number(d$bathrooms),
    lot_area = csv_number(d$Lot_Area), garage_spaces = csv_number(d$Garage_Cars),
    verification = rep("", nrow(d)), notes = rep("", nrow(d)),
    included = rep("yes", nrow(d)), excluded_reason = rep("", nrow(d))
  )
  stopifnot(!any(grepl("[\",\n]", c(d$id, d$address))))
  lines <- c(paste(names(cols), collapse = ","), do.call(paste, c(cols, sep = ",")))
  writeLines(lines, path, useBytes = TRUE)
}

months_between <- function(from, to) as.numeric(as.Date(to) - as.Date(from)) / 30.4375

# ---------------------------------------------------------------------------------------
# JSON, written by hand: numbers with 17 significant digits round-trip a double exactly.
# A numeric vector wrapped in I() is always an array; a bare length-1 vector is a scalar.
# ---------------------------------------------------------------------------------------
json_string <- function(s) {
  s <- gsub("\\", "\\\\", s, fixed = TRUE)
  s <- gsub("\"", "\\\"", s, fixed = TRUE)
  paste0("\"", s, "\"")
}
json_number <- function(x) {
  if (!all(is.finite(x))) stop("non-finite number in fixture: ", paste(x, collapse = ", "))
  out <- sprintf("%.17g", x)
  out[x == 0] <- "0" # also turns -0 into 0
  out
}
to_json <- function(x, indent = "") {
  inner <- paste0(indent, "  ")
  if (is.null(x)) return("null")
  if (!is.list(x) && length(x) == 0) return("[]")
  if (is.list(x)) {
    if (length(x) == 0) return(if (is.null(names(x))) "[]" else "{}")
    parts <- vapply(x, to_json, "", indent = inner)
    if (!is.null(names(x)))
      parts <- paste0(json_string(names(x)), ": ", parts)
    open <- if (is.null(names(x))) "[" else "{"
    close <- if (is.null(names(x))) "]" else "}"
    return(paste0(open, "\n", inner, paste(parts, collapse = paste0(",\n", inner)), "\n", indent, close))
  }
  vals <- if (is.logical(x)) ifelse(x, "true", "false")
          else if (is.character(x)) json_string(x)
          else json_number(as.numeric(x))
  if (length(x) == 1 && !inherits(x, "AsIs")) return(vals)
  paste0("[", paste(vals, collapse = ", "), "]")
}
# Named numeric vector -> JSON object.
as_object <- function(v) as.list(setNames(as.numeric(v), names(v)))

# ---------------------------------------------------------------------------------------
# One case
# ---------------------------------------------------------------------------------------
median_characteristics <- function(d) {
  half <- function(x) round(median(x) * 2) / 2
  list(
    living_area = round(median(d$Gr_Liv_Area)), rooms = round(median(d$TotRms_AbvGrd)),
    bedrooms = round(median(d$Bedroom_AbvGr)), bathrooms = half(d$bathrooms),
    lot_area = round(median(d$Lot_Area)), garage_spaces = round(median(d$Garage_Cars))
  )
}

# The subject's characteristics (our JSON names) and the predictor values R uses.
build_subject <- function(name, spec, d, effective_date, predictors) {
  ch <- median_characteristics(d)
  age <- if (is.null(spec$age)) round(median(d$age)) else spec$age
  for (k in setdiff(names(spec), "age")) ch[[k]] <- spec[[k]]
  effective_year <- as.integer(substr(effective_date, 1, 4))
  year_built <- effective_year - age
  subject <- list(
    name = name,
    address = paste("Invented subject", name),
    effective_date = effective_date,
    living_area = ch$living_area, year_built = year_built, rooms = ch$rooms,
    bedrooms = ch$bedrooms, bathrooms = ch$bathrooms, lot_area = ch$lot_area,
    garage_spaces = ch$garage_spaces
  )
  all_values <- c(
    living_area = ch$living_area, "living_area^2" = ch$living_area^2, age = age,
    rooms = ch$rooms, bedrooms = ch$bedrooms, bathrooms = ch$bathrooms,
    lot_area = ch$lot_area, garage_spaces = ch$garage_spaces, months_since_sale = 0
  )
  newdata <- data.frame(
    Gr_Liv_Area = ch$living_area, age = age, TotRms_AbvGrd = ch$rooms,
    Bedroom_AbvGr = ch$bedrooms, bathrooms = ch$bathrooms, Lot_Area = ch$lot_area,
    Garage_Cars = ch$garage_spaces, months_since_sale = 0
  )
  list(subject = subject, values = all_values[predictors], newdata = newdata)
}

# Refits the case from the written CSV alone, deriving age and months_since_sale the way
# DESIGN.md defines them, so the fixture's numbers are exactly what the CSV implies.
check_refit_from_csv <- function(path, spec, effective_date, fit) {
  csv <- read.csv(path, colClasses = "character")
  stopifnot(identical(names(csv)[1:4], c("id", "address", "sale_date", "sale_price")))
  num <- function(col) as.numeric(csv[[col]])
  r <- data.frame(
    Sale_Price = num("sale_price"), Gr_Liv_Area = num("living_area"),
    age = as.integer(substr(csv$sale_date, 1, 4)) - num("year_built"),
    TotRms_AbvGrd = num("rooms"), Bedroom_AbvGr = num("bedrooms"), bathrooms = num("bathrooms"),
    Lot_Area = num("lot_area"), Garage_Cars = num("garage_spaces"),
    months_since_sale = months_between(csv$sale_date, effective_date)
  )
  refit <- lm(formula(fit), data = r)
  if (!isTRUE(all.equal(coef(refit), coef(fit), tolerance = 1e-12)))
    stop(spec$case, ": refit from the CSV does not reproduce the coefficients")
}

run_case <- function(spec) {
  d <- neighborhood_sales(spec$neighborhood)
  effective_date <- if (identical(spec$effective_date, "last-sale")) max(d$sale_date)
                    else DEFAULT_EFFECTIVE_DATE
  d$months_since_sale <- months_between(d$sale_date, effective_date)
  preds <- spec$predictors
  response <- if (spec$transform == "log") "log(Sale_Price)" else "Sale_Price"
  formula_text <- paste(response, "~", paste(R_TERM[preds], collapse = " + "))
  fit <- lm(as.formula(formula_text), data = d)
  s <- summary(fit)
  X <- model.matrix(fit)
  y <- model.response(model.frame(fit))
  n <- nrow(X); k <- length(preds); p <- k + 1
  stopifnot(ncol(X) == p, n == nrow(d), !any(is.na(coef(fit))))
  e <- residuals(fit); h <- hatvalues(fit)
  sigma <- s$sigma
  term_names <- c("(intercept)", preds)

  ctab <- s$coefficients
  coefficients <- lapply(seq_len(p), function(j) list(
    term = term_names[j], estimate = ctab[j, 1], stdError = ctab[j, 2], t = ctab[j, 3], p = ctab[j, 4]
  ))
  fstat <- s$fstatistic

  Xp <- X[, -1, drop = FALSE]; colnames(Xp) <- preds
  vif <- if (k == 1) setNames(1, preds) else diag(solve(cor(Xp)))
  standardized <- coef(fit)[-1] * apply(Xp, 2, sd) / sd(y); names(standardized) <- preds

  # Condition indices of [1, X], columns scaled to unit length, not centred.
  scaled <- sweep(X, 2, sqrt(colSums(X^2)), "/")
  dvals <- svd(scaled)$d
  condition_indices <- max(dvals) / dvals

  tss <- sum((y - mean(y))^2)
  press_resid <- e / (1 - h)
  press <- sum(press_resid^2)

  # Koenker's studentized Breusch-Pagan: n R^2 of e^2 on the model's regressors.
  aux <- lm(e^2 ~ Xp)
  bp_stat <- n * summary(aux)$r.squared

  # Jarque-Bera with central moments divided by n.
  m2 <- mean((e - mean(e))^2); m3 <- mean((e - mean(e))^3); m4 <- mean((e - mean(e))^4)
  skew <- m3 / m2^1.5; kurt <- m4 / m2^2
  jb <- (n / 6) * (skew^2 + (kurt - 3)^2 / 4)

  # Ratio study on leave-one-out predictions, in price units.
  price <- d$Sale_Price
  loo <- y - press_resid
  loo_price <- if (spec$transform == "log") exp(loo) else loo
  ratio <- loo_price / price
  med <- median(ratio)
  prb_fit <- lm(I((ratio - med) / med) ~ I(log2(0.5 * loo_price / med + 0.5 * price)))

  smearing <- if (spec$transform == "log") mean(exp(e)) else NULL

  # Subjects
  XtX_inv <- chol2inv(qr.R(qr(X)))
  max_hat <- max(h)
  ranges <- apply(Xp, 2, range)
  subjects <- lapply(names(spec$subjects), function(name) {
    b <- build_subject(name, spec$subjects[[name]], d, effective_date, preds)
    intervals <- list()
    for (level in LEVELS) {
      conf <- predict(fit, b$newdata, interval = "confidence", level = level, se.fit = TRUE)
      pred <- predict(fit, b$newdata, interval = "prediction", level = level, se.fit = TRUE)
      stopifnot(all.equal(conf$fit[1, "fit"], pred$fit[1, "fit"]))
      intervals[[format(level)]] <- list(
        fit = conf$fit[1, "fit"], seFit = conf$se.fit[[1]],
        confidence = I(unname(conf$fit[1, c("lwr", "upr")])),
        prediction = I(unname(pred$fit[1, c("lwr", "upr")]))
      )
    }
    se_fit <- intervals[["0.95"]]$seFit
    leverage <- se_fit^2 / sigma^2
    x0 <- c(1, b$values)
    stopifnot(abs(leverage - drop(t(x0) %*% XtX_inv %*% x0)) < 1e-9 * max(1, leverage))
    outside <- preds[b$values < ranges[1, ] | b$values > ranges[2, ]]
    hidden <- length(outside) == 0 && leverage > max_hat
    role_ok <- switch(name,
      central = length(outside) == 0 && leverage < 2 * p / n,
      "large-area" = "living_area" %in% outside,
      "hidden-extrapolation" = hidden,
      stop("unknown subject role ", name))
    if (!role_ok) stop(spec$case, ": subject ", name, " does not play its role (leverage ",
                       leverage, ", max hat ", max_hat, ", outside: ", paste(outside, collapse = ","), ")")
    out <- c(b$subject, list(
      values = as_object(b$values),
      intervals = intervals,
      leverage = leverage, maxLeverage = max_hat,
      outsideRange = I(outside), hiddenExtrapolation = hidden
    ))
    if (spec$transform == "log") {
      fit0 <- intervals[["0.95"]]$fit
      out$priceScale <- list(
        median = exp(fit0), value = exp(fit0) * smearing,
        intervals = setNames(lapply(intervals, function(iv) list(
          confidence = I(exp(iv$confidence)), prediction = I(exp(iv$prediction)))), names(intervals))
      )
    }
    out
  })

  expected <- list(
    case = spec$case,
    source = SOURCE,
    formula = formula_text,
    predictors = I(preds),
    transform = spec$transform,
    n = n,
    neighborhood = spec$neighborhood,
    salesFile = paste0(spec$case, ".sales.csv"),
    effectiveDate = effective_date,
    coefficients = coefficients,
    sigma = sigma,
    rSquared = s$r.squared,
    adjRSquared = s$adj.r.squared,
    fStatistic = unname(fstat["value"]),
    fPValue = pf(fstat["value"], fstat["numdf"], fstat["dendf"], lower.tail = FALSE)[[1]],
    dfResidual = fit$df.residual,
    vif = as_object(vif),
    standardized = as_object(standardized),
    conditionIndices = I(condition_indices),
    conditionNumber = max(condition_indices),
    hat = I(unname(h)),
    rstandard = I(unname(rstandard(fit))),
    rstudent = I(unname(rstudent(fit))),
    cooks = I(unname(cooks.distance(fit))),
    dffits = I(unname(dffits(fit))),
    fitted = I(unname(fitted(fit))),
    residuals = I(unname(e)),
    press = press,
    predictedRSquared = 1 - press / tss,
    ids = I(d$id),
    smearing = smearing,
    breuschPaganKoenker = list(statistic = bp_stat, df = k, p = pchisq(bp_stat, k, lower.tail = FALSE)),
    jarqueBera = list(statistic = jb, p = pchisq(jb, 2, lower.tail = FALSE)),
    ratioStudy = list(
      medianRatio = med, meanRatio = mean(ratio), weightedMeanRatio = sum(loo_price) / sum(price),
      cod = 100 * mean(abs(ratio - med)) / med,
      prd = mean(ratio) / (sum(loo_price) / sum(price)),
      prb = unname(coef(prb_fit)[2])
    ),
    subjects = subjects
  )

  sales_path <- file.path(OUT_DIR, paste0(spec$case, ".sales.csv"))
  write_sales_csv(d, sales_path)
  check_refit_from_csv(sales_path, spec, effective_date, fit)
  writeLines(to_json(expected), file.path(OUT_DIR, paste0(spec$case, ".expected.json")), useBytes = TRUE)
  cat(sprintf("%-26s n=%3d k=%d R2=%.4f adjR2=%.4f sigma=%.6g F=%.4g COD=%.2f PRD=%.4f maxhat=%.3f\n",
              spec$case, n, k, s$r.squared, s$adj.r.squared, sigma, fstat[["value"]],
              expected$ratioStudy$cod, expected$ratioStudy$prd, max_hat))
  for (sj in subjects)
    cat(sprintf("    %-22s leverage=%.4f fit=%.6g PI95=[%.6g, %.6g] outside=%s\n", sj$name, sj$leverage,
                sj$intervals[["0.95"]]$fit, sj$intervals[["0.95"]]$prediction[1],
                sj$intervals[["0.95"]]$prediction[2], paste(sj$outsideRange, collapse = ",")))
}

cat(SOURCE, "; modeldata ", format(packageVersion("modeldata")), "\n", sep = "")
for (spec in CASES) run_case(spec)
