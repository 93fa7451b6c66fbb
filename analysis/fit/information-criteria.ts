/**
 * Gaussian log-likelihood and information criteria of a least-squares fit with the error variance
 * estimated (so k = p + 1 parameters): −2 ln L = n·(ln(2π·RSS/n) + 1) − Σ ln wᵢ;
 * AIC = −2 ln L + 2k (Akaike 1974), AICc = AIC + 2k(k + 1)/(n − k − 1) (Hurvich & Tsai 1989),
 * BIC = −2 ln L + k ln n (Schwarz 1978). Comparisons are meaningful only on the same data and weights.
 *
 * @param rss - weighted residual sum of squares (unit of y²·w)
 * @param n - number of points
 * @param p - number of fitted model parameters
 * @param sumLogWeights - Σ ln wᵢ (0 when unweighted)
 * @returns the criteria; all null when rss is 0 (exact fit, likelihood unbounded); aicc null when n ≤ p + 2
 * @example informationCriteria(2, 10, 2, 0).aic // 10·(ln(2π·0.2) + 1) + 6
 */
export function informationCriteria(rss: number, n: number, p: number, sumLogWeights = 0): { logLikelihood: number | null; aic: number | null; aicc: number | null; bic: number | null } {
  if (!(rss > 0) || !Number.isFinite(rss)) return { logLikelihood: null, aic: null, aicc: null, bic: null };
  const k = p + 1;
  const m2ll = n * (Math.log((2 * Math.PI * rss) / n) + 1) - sumLogWeights;
  const aic = m2ll + 2 * k;
  return {
    logLikelihood: -m2ll / 2,
    aic,
    aicc: n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : null,
    bic: m2ll + k * Math.log(n),
  };
}
