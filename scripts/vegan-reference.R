#!/usr/bin/env Rscript
# Reference values for the lib/diversity tests.
#
# Run:  Rscript scripts/vegan-reference.R   (needs Debian's r-cran-vegan and r-cran-jsonlite)
# Writes tests/fixtures/vegan/reference.json, which is committed so CI needs no R.
#
# Two kinds of values:
#   "vegan"   - returned by R vegan itself (estimateR, specpool, rarefy, specaccum,
#               diversity, renyi, simpson.unb) on vegan's own data sets BCI (Condit et al.
#               2002, 50 plots x 225 tree species) and dune (Jongman et al. 1987).
#   "formula" - fields vegan lacks, computed here from the published formulas, written
#               plainly in R without reference to the TypeScript code: the Chao (1987)
#               log-normal interval, ACE/ICE standard errors by the delta method with
#               gradients from R's symbolic deriv(), the Heltshe & Forrester (1983) jack1
#               se and a direct leave-one-out jackknife, the unconditional Mao Tau band
#               (Colwell, Mao & Chang 2004), Chao & Jost (2012) coverage, Chao1 in the
#               Chao-group form, the Chao, Wang & Jost (2013) entropy estimator, and the
#               extrapolated curves (Shen, Chao & Lin 2003; Colwell et al. 2012).

suppressMessages(library(vegan))
library(jsonlite)

data(BCI)
data(dune)
z <- qnorm(0.975)

out_file <- "tests/fixtures/vegan/reference.json"

# ---------------------------------------------------------------- helpers
lognormal_ci <- function(sobs, est, se) {
  # Chao (1987): K = exp(z sqrt(log(1 + var / T^2))), T = est - sobs
  unseen <- est - sobs
  if (!is.finite(se) || unseen <= 0 || se == 0) return(c(est, est))
  K <- exp(z * sqrt(log(1 + se^2 / unseen^2)))
  c(sobs + unseen / K, sobs + unseen * K)
}

delta_var <- function(grad, f, shat) {
  # multinomial covariance cov(f_i, f_j) = f_i (delta_ij - f_j / shat)
  Sigma <- diag(f, length(f)) - outer(f, f) / shat
  max(as.numeric(t(grad) %*% Sigma %*% grad), 0)
}

# Chao1 in the Chao-group form (Chiu et al. 2014 factor (N-1)/N; classic if f2 > 0,
# bias-corrected if f2 = 0) with the Chao (1987) variance. N = individuals or units.
chao_group <- function(x, N) {
  x <- x[x > 0]
  S <- length(x); f1 <- sum(x == 1); f2 <- sum(x == 2)
  A <- (N - 1) / N
  f0 <- if (f2 > 0) A * f1^2 / (2 * f2) else A * f1 * (f1 - 1) / 2
  est <- S + f0
  v <- if (f2 > 0) {
    G <- f1 / f2
    f2 * (A * G^2 / 2 + A^2 * G^3 + A^2 * G^4 / 4)
  } else {
    A * f1 * (f1 - 1) / 2 + A^2 * f1 * (2 * f1 - 1)^2 / 4 - A^2 * f1^4 / (4 * est)
  }
  ci <- lognormal_ci(S, est, sqrt(v))
  list(estimate = est, se = sqrt(v), lower = ci[1], upper = ci[2], f0 = f0)
}

# ACE (Chao & Lee 1992) / ICE (Lee & Chao 1994) as an R expression in a1..a10, so deriv()
# gives the exact gradient. uf = m_infr/(m_infr - 1) for ICE, 1 for ACE.
coverage_expr <- function(with_gamma, squared) {
  a <- paste0("a", 1:10)
  Srare <- paste0("(", paste(a, collapse = " + "), ")")
  Nrare <- paste0("(", paste0(1:10, " * ", a, collapse = " + "), ")")
  M <- paste0("(", paste0((1:10) * (0:9), " * ", a, collapse = " + "), ")")
  C <- paste0("(1 - a1 / ", Nrare, ")")
  den <- if (squared) paste0("(", Nrare, "^2)") else paste0("(", Nrare, " * (", Nrare, " - 1))")
  G <- paste0("(", Srare, " / ", C, " * uf * ", M, " / ", den, " - 1)")
  e <- paste0("Sab + ", Srare, " / ", C)
  if (with_gamma) e <- paste0(e, " + a1 / ", C, " * ", G)
  list(expr = parse(text = e)[[1]], gamma = parse(text = G)[[1]])
}

coverage_estimate <- function(rare, Sab, uf, squared) {
  env <- c(as.list(setNames(rare, paste0("a", 1:10))), list(Sab = Sab, uf = uf))
  g2 <- eval(coverage_expr(TRUE, squared)$gamma, env)
  ex <- coverage_expr(g2 > 0, squared)$expr
  d <- eval(deriv(ex, paste0("a", 1:10)), env)
  est <- as.numeric(d)
  grad <- as.numeric(attr(d, "gradient"))
  v <- delta_var(grad, rare, est)
  list(estimate = est, se = sqrt(v), gamma2 = g2)
}

rare_freqs <- function(x) sapply(1:10, function(k) sum(x == k))

# Chao, Wang & Jost (2013) entropy estimator, direct sums.
chao_shannon <- function(x) {
  x <- x[x > 0]
  n <- sum(x); f1 <- sum(x == 1); f2 <- sum(x == 2)
  A <- if (f2 > 0) 2 * f2 / ((n - 1) * f1 + 2 * f2) else if (f1 > 0) 2 / ((n - 1) * (f1 - 1) + 2) else 1
  Hn <- cumsum(1 / seq_len(n - 1)) # Hn[k] = sum_{j=1}^{k} 1/j
  xs <- x[x <= n - 1]
  term1 <- sum(xs / n * (Hn[n - 1] - ifelse(xs > 1, Hn[pmax(xs - 1, 1)], 0)))
  term2 <- 0
  if (f1 > 0 && A < 1) {
    r <- seq_len(n - 1)
    term2 <- f1 / n * (1 - A)^(1 - n) * (-log(A) - sum((1 - A)^r / r))
  }
  term1 + term2
}

# Probability that a class of k is missed by m draws from N without replacement.
miss_prob <- function(N, k, m) ifelse(N - k < m, 0, exp(lchoose(N - k, m) - lchoose(N, m)))

# Interpolated richness, unconditional variance (Colwell et al. 2012 / 2004) and
# coverage (Chao & Jost 2012) at effort m <= N; `tot` = n or U.
interp_ref <- function(x, N, tot, m, shat) {
  x <- x[x > 0]
  a <- miss_prob(N, x, m)
  E <- sum(1 - a)
  v <- sum((1 - a)^2) - E^2 / shat
  cov <- if (m < N) {
    keep <- x <= N - m
    1 - sum(x[keep] / tot * exp(lchoose(N - x[keep], m) - lchoose(N - 1, m)))
  } else NA
  list(size = m, richness = E, se = sqrt(max(v, 0)), coverage = cov)
}

# Extrapolation: S(N + m) = S + f0 (1 - Ahat^m), Ahat = N f0 / (N f0 + f1); delta-method
# variance over (f1, f2) by deriv(); coverage 1 - (f1/tot) Ahat^(m + 1).
extrap_ref <- function(x, N, tot, mstar) {
  x <- x[x > 0]
  S <- length(x); f1v <- sum(x == 1); f2v <- sum(x == 2); R <- S - f1v - f2v
  f0e <- if (f2v > 0) quote(A * f1^2 / (2 * f2)) else quote(A * f1 * (f1 - 1) / (2 * (f2 + 1)))
  ex <- substitute(f1 + f2 + R + F0 * (1 - (N * F0 / (N * F0 + f1))^m), list(F0 = f0e))
  env <- list(f1 = f1v, f2 = f2v, R = R, A = (N - 1) / N, N = N, m = mstar)
  d <- eval(deriv(ex, c("f1", "f2")), env)
  est <- as.numeric(d)
  grad <- c(as.numeric(attr(d, "gradient")), 1)
  shat <- chao_group(x, N)$estimate
  f0 <- chao_group(x, N)$f0
  v <- if (f0 > 0) delta_var(grad, c(f1v, f2v, R), shat) else 0
  Ahat <- if (f1v > 0) N * f0 / (N * f0 + f1v) else 0
  list(size = N + mstar, richness = est, se = sqrt(v), coverage = 1 - f1v / tot * Ahat^(mstar + 1))
}

coverage_obs <- function(x, N, tot) {
  x <- x[x > 0]
  f1 <- sum(x == 1); f2 <- sum(x == 2)
  Ahat <- if (f1 == 0) 0 else if (f2 > 0) (N - 1) * f1 / ((N - 1) * f1 + 2 * f2) else (N - 1) * (f1 - 1) / ((N - 1) * (f1 - 1) + 2)
  1 - f1 / tot * Ahat
}

# ---------------------------------------------------------------- abundance
abundance_ref <- function(name, dataset, rows, x, sizes, extra) {
  x <- as.numeric(x)
  xp <- x[x > 0]
  n <- sum(xp)
  er <- estimateR(x)
  H <- diversity(x, "shannon")
  ch1ci <- lognormal_ci(er[["S.obs"]], er[["S.chao1"]], er[["se.chao1"]])
  rare <- rare_freqs(xp)
  ace <- if (sum((1:10) * rare) == 0) NULL else if (rare[1] >= sum((1:10) * rare)) NULL else
    coverage_estimate(rare, sum(xp > 10), 1, FALSE)
  aceci <- if (is.null(ace)) c(NA, NA) else lognormal_ci(length(xp), ace$estimate, ace$se)
  rr <- rarefy(x, sizes, se = TRUE)
  shat <- chao_group(xp, n)$estimate
  hill_obs <- as.numeric(renyi(x, scales = c(0, 1, 2), hill = TRUE))
  list(
    name = name, dataset = dataset, rows = rows, counts = x,
    vegan = list(
      S.obs = er[["S.obs"]], S.chao1 = er[["S.chao1"]], se.chao1 = er[["se.chao1"]],
      S.ACE = er[["S.ACE"]], se.ACE = er[["se.ACE"]],
      shannon = H, simpson = diversity(x, "simpson"), invsimpson = diversity(x, "invsimpson"),
      pielou = H / log(specnumber(x)),
      renyi_hill = hill_obs,
      simpson_unb_inverse = simpson.unb(x, inverse = TRUE),
      rarefy = list(sizes = sizes, S = as.numeric(rr[1, ]), se = as.numeric(rr[2, ]))
    ),
    formula = list(
      chao1_ci = ch1ci,
      ace = if (is.null(ace)) NULL else list(estimate = ace$estimate, se = ace$se, lower = aceci[1], upper = aceci[2]),
      chao1_classic = chao_group(xp, n),
      coverage = coverage_obs(xp, n, n),
      hill_asymptotic = c(shat, exp(chao_shannon(xp)), n * (n - 1) / sum(xp * (xp - 1))),
      interpolated = lapply(sizes[sizes <= n], function(m) interp_ref(xp, n, n, m, shat)),
      extrapolated = lapply(extra, function(ms) extrap_ref(xp, n, n, ms))
    )
  )
}

# ---------------------------------------------------------------- incidence
incidence_ref <- function(name, dataset, X, extra) {
  X <- as.matrix(X)
  T <- nrow(X)
  pres <- X > 0
  Y <- colSums(pres)
  Yp <- Y[Y > 0]
  U <- sum(Yp)
  sp <- specpool(X)
  q1 <- sum(Yp == 1)
  # Heltshe & Forrester (1983): ((T-1)/T)(sum_u r_u^2 - Q1^2/T)
  r_u <- rowSums(pres[, Y == 1, drop = FALSE])
  jack1_var_hf <- (T - 1) / T * (sum(r_u^2) - q1^2 / T)
  # Direct leave-one-out jackknife of the observed richness.
  loo <- sapply(seq_len(T), function(u) sum(colSums(pres[-u, , drop = FALSE]) > 0))
  jack1_var_loo <- (T - 1) / T * sum((loo - mean(loo))^2)
  # ICE, classic form, m_infr = units holding an infrequent species.
  rare <- rare_freqs(Yp)
  m_infr <- sum(rowSums(pres[, Y > 0 & Y <= 10, drop = FALSE]) > 0)
  ice <- coverage_estimate(rare, sum(Yp > 10), m_infr / (m_infr - 1), TRUE)
  iceci <- lognormal_ci(length(Yp), ice$estimate, ice$se)
  # jack2 se by the delta method (our choice; vegan has none).
  q2 <- sum(Yp == 2)
  j2 <- sp$jack2
  d <- c(1 + (2 * T - 3) / T, 1 - (T - 2)^2 / (T * (T - 1)), 1)
  j2var <- delta_var(d, c(q1, q2, length(Yp) - q1 - q2), j2)
  acc <- specaccum(X, method = "exact")
  acc_unc <- specaccum(X, method = "exact", conditioned = FALSE, gamma = "chao")
  shat <- sp$chao
  unc <- sapply(seq_len(T), function(t) interp_ref(Yp, T, U, t, shat)$se)
  list(
    name = name, dataset = dataset, units = T,
    vegan = list(
      Species = sp$Species, chao = sp$chao, chao.se = sp$chao.se, jack1 = sp$jack1,
      jack1.se = sp$jack1.se, jack2 = sp$jack2,
      specaccum = list(richness = as.numeric(acc$richness), sd = as.numeric(acc$sd)),
      specaccum_unconditional_chao_sd = as.numeric(acc_unc$sd)
    ),
    formula = list(
      chao2_ci = lognormal_ci(sp$Species, sp$chao, sp$chao.se),
      jack1_se_hf = sqrt(jack1_var_hf),
      jack1_se_leave_one_out = sqrt(jack1_var_loo),
      jack2_se_delta = sqrt(j2var),
      ice = list(estimate = ice$estimate, se = ice$se, lower = iceci[1], upper = iceci[2], m_infr = m_infr),
      coverage = coverage_obs(Yp, T, U),
      accumulation_unconditional_sd = unc,
      accumulation_lower = pmax(0, as.numeric(acc$richness) - z * unc),
      accumulation_upper = as.numeric(acc$richness) + z * unc,
      interpolated = lapply(unique(c(1, floor(T / 2), T - 1, T)), function(t) interp_ref(Yp, T, U, t, shat)),
      extrapolated = lapply(extra, function(ts) extrap_ref(Yp, T, U, ts))
    )
  )
}

# ---------------------------------------------------------------- zones
# Two zones from BCI (plots 1-25 and 26-50), compared at a common size (the smaller
# doubled sample size) and at a common coverage 0.99.
zone_at_size <- function(x, m) {
  x <- x[x > 0]; n <- sum(x)
  if (m <= n) interp_ref(x, n, n, m, chao_group(x, n)$estimate) else extrap_ref(x, n, n, m - n)
}
zone_at_coverage <- function(x, C) {
  x <- x[x > 0]; n <- sum(x)
  if (C <= coverage_obs(x, n, n)) {
    covs <- sapply(0:(n - 1), function(m) interp_ref(x, n, n, m, 1)$coverage)
    m <- (0:(n - 1))[which.min(abs(covs - C))]
    if (abs(coverage_obs(x, n, n) - C) < abs(covs[m + 1] - C)) m <- n
    return(zone_at_size(x, m))
  }
  f1 <- sum(x == 1); f2 <- sum(x == 2)
  Ahat <- if (f2 > 0) (n - 1) * f1 / ((n - 1) * f1 + 2 * f2) else (n - 1) * (f1 - 1) / ((n - 1) * (f1 - 1) + 2)
  mstar <- log((1 - C) * n / f1) / log(Ahat) - 1
  zone_at_size(x, n + mstar)
}
zone_a <- colSums(BCI[1:25, ])
zone_b <- colSums(BCI[26:50, ])
common_size <- min(2 * sum(zone_a), 2 * sum(zone_b))

# ---------------------------------------------------------------- assemble
bci <- as.matrix(BCI)
dn <- as.matrix(dune)
ref <- list(
  generator = "scripts/vegan-reference.R",
  R = R.version.string,
  vegan = as.character(packageVersion("vegan")),
  notes = c(
    "BCI: Condit et al. (2002), vegan data(BCI), 50 plots x 225 species, tree counts.",
    "dune: Jongman et al. (1987), vegan data(dune), 20 sites x 30 species; values are cover classes, used here as integer counts.",
    "'vegan' blocks are vegan's own output; 'formula' blocks are computed in this script from the published formulas (vegan lacks them).",
    "ACE/ICE se: delta method with R deriv() gradients of the estimator itself; vegan's se.ACE is stored for comparison only.",
    "Hill q1/q2 intervals are bootstrap-based in the engine and have no R reference here."
  ),
  data = list(BCI = unname(lapply(seq_len(nrow(bci)), function(i) as.integer(bci[i, ]))),
              dune = unname(lapply(seq_len(nrow(dn)), function(i) as.integer(dn[i, ])))),
  abundance = list(
    abundance_ref("BCI pooled", "BCI", "all", colSums(BCI),
                  c(1, 2, 10, 100, 1000, 5000, 10000, 20000, 21457, 30000), c(1, 100, 1000, 10000, 21457)),
    abundance_ref("BCI plot 34", "BCI", 34, BCI[34, ], c(1, 10, 50, 100, 200, 300, 400), c(1, 50, 200, 400)),
    abundance_ref("BCI plot 37", "BCI", 37, BCI[37, ], c(1, 10, 50, 100, 200, 300), c(1, 50, 200, 300)),
    abundance_ref("dune pooled", "dune", "all", colSums(dune), c(1, 10, 50, 100, 200, 300, 400, 460), c(1, 100, 460)),
    abundance_ref("dune site 1", "dune", 1, dune[1, ], c(1, 5, 10, 15), c(1, 5, 20))
  ),
  incidence = list(
    incidence_ref("BCI", "BCI", BCI, c(1, 10, 25, 50)),
    incidence_ref("dune", "dune", dune, c(1, 5, 10, 20))
  ),
  zones = list(
    rows = list(a = 1:25, b = 26:50),
    size = common_size,
    coverage = 0.99,
    at_size = list(a = zone_at_size(zone_a, common_size), b = zone_at_size(zone_b, common_size)),
    at_coverage = list(a = zone_at_coverage(zone_a, 0.99), b = zone_at_coverage(zone_b, 0.99))
  )
)

dir.create(dirname(out_file), recursive = TRUE, showWarnings = FALSE)
writeLines(toJSON(ref, auto_unbox = TRUE, digits = NA, na = "null", null = "null", pretty = FALSE), out_file)
cat("wrote", out_file, "\n")
