import { requireFinite, requireProbability, StatsInputError } from "./errors";

const MAX_SAMPLE_SIZE = 1e9;
// Attribute plans allow a handful of failures; the bound keeps the summation short.
const MAX_FAILURES = 1000;

/**
 * Sample size for attribute (pass/fail) testing at confidence C and reliability R.
 * With no failures allowed, the success-run theorem [std, reliability texts]: the smallest n with
 * R^n ≤ 1 − C, i.e. n = ⌈ln(1 − C) / ln R⌉. With f failures allowed, the smallest n for which the
 * binomial probability of at most f failures, each with probability 1 − R, is ≤ 1 − C.
 */
export function successRunSampleSize(
  confidence: number,
  reliability: number,
  failures = 0,
): number {
  requireProbability(confidence, "Confidence", "confidence");
  requireProbability(reliability, "Reliability", "reliability");
  requireFinite(failures, "Failures allowed", "failures");
  if (failures < 0 || !Number.isInteger(failures) || failures > MAX_FAILURES) {
    throw new StatsInputError(
      `Failures allowed must be a whole number from 0 to ${MAX_FAILURES} (got ${failures}).`,
      "failures",
    );
  }
  const alpha = 1 - confidence;
  const logR = Math.log(reliability);
  const logP = Math.log1p(-reliability); // ln(1 − R) without cancellation as R → 1
  const accepts = (n: number) => logBinomialCdf(failures, n, logP, logR) <= Math.log(alpha);

  const tooLarge = () =>
    new StatsInputError(
      "The sample size exceeds 1,000,000,000 parts; lower the confidence or the reliability.",
      "reliability",
    );
  // Gallop from the zero-failure estimate, then bisect: the probability falls as n rises.
  let lo = failures; // n = f passes with certainty (at most f failures), so never qualifies
  let hi = Math.max(failures + 1, Math.ceil(Math.log(alpha) / logR));
  if (hi > MAX_SAMPLE_SIZE) throw tooLarge();
  while (!accepts(hi)) {
    lo = hi;
    hi *= 2;
    if (hi > 2 * MAX_SAMPLE_SIZE) throw tooLarge();
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (accepts(mid)) hi = mid;
    else lo = mid;
  }
  if (hi > MAX_SAMPLE_SIZE) throw tooLarge();
  return hi;
}

/** ln P(X ≤ f) for X ~ Binomial(n, p), from ln p and ln(1 − p), summed in log space. */
function logBinomialCdf(f: number, n: number, logP: number, logQ: number): number {
  if (f >= n) return 0;
  // Term k = C(n, k) p^k q^(n−k); the ratio of term k+1 to term k is (n − k)/(k + 1) · p/q.
  let logTerm = n * logQ;
  let logSum = logTerm;
  for (let k = 0; k < f; k++) {
    logTerm += Math.log((n - k) / (k + 1)) + logP - logQ;
    logSum = logAddExp(logSum, logTerm);
  }
  return logSum;
}

function logAddExp(a: number, b: number): number {
  const high = Math.max(a, b);
  if (high === -Infinity) return -Infinity;
  return high + Math.log(Math.exp(a - high) + Math.exp(b - high));
}
