import type { ArmaFitSummary } from '@shared/contract/diagnostics.ts';

const SUBSCRIPTS = '₀₁₂₃₄₅₆₇₈₉';

/** A whole number written in Unicode subscript digits (φ₁, θ₁₂), as coefficients are printed in the literature. */
export function subscript(n: number): string {
  return String(n).replace(/\d/g, (d) => SUBSCRIPTS[Number(d)]);
}

/**
 * The usual short name of an ARMA(p, q) model: "AR(1)", "MA(2)", "ARMA(1, 1)", and "white noise"
 * for (0, 0) (Box, Jenkins, Reinsel & Ljung 2015, ch. 3 naming; common practice).
 */
export function armaName(p: number, q: number): string {
  if (p === 0 && q === 0) return 'white noise';
  if (q === 0) return `AR(${p})`;
  if (p === 0) return `MA(${q})`;
  return `ARMA(${p}, ${q})`;
}

/**
 * The sign convention of the coefficient table, stated in words beside it: the model is
 * written with every term added (as in Box, Jenkins & Reinsel's textbook form for the AR part,
 * and with plus signs for the moving-average part), so the sign of a coefficient reads directly.
 */
export const ARMA_SIGNS =
  'Model: xₜ − μ = φ₁(xₜ₋₁ − μ) + … + eₜ + θ₁eₜ₋₁ + …, every term added: a positive φ or θ pushes the value the same way as the past value or shock it multiplies.';

/** One estimated parameter: its symbol, estimate and standard error (null where none was given). */
export interface CoefficientRow {
  symbol: string;
  name: string;
  estimate: number;
  standardError: number | null;
}

/**
 * The fitted parameters as table rows: φ₁…φp (autoregressive), θ₁…θq (moving average) and the
 * mean μ when it was estimated. Signs: every term enters with a plus, so a positive φᵢ or θⱼ pushes
 * the value the same way as the past value or shock it multiplies: x[t] − μ = Σ φᵢ(x[t−i] − μ) + e[t] + Σ θⱼ e[t−j].
 */
export function coefficientRows(m: ArmaFitSummary): CoefficientRow[] {
  const rows: CoefficientRow[] = [];
  m.ar.forEach((v, i) =>
    rows.push({ symbol: `φ${subscript(i + 1)}`, name: `autoregressive, lag ${i + 1}`, estimate: v, standardError: m.standardErrors.ar[i] ?? null }),
  );
  m.ma.forEach((v, i) =>
    rows.push({ symbol: `θ${subscript(i + 1)}`, name: `moving average, lag ${i + 1}`, estimate: v, standardError: m.standardErrors.ma[i] ?? null }),
  );
  if (m.mean !== null) rows.push({ symbol: 'μ', name: 'mean', estimate: m.mean, standardError: m.standardErrors.mean });
  return rows;
}

/** A model in one line, e.g. "AR(1): φ₁ = 0.82 ± 0.03", for a verdict heading. */
export function armaOneLine(m: ArmaFitSummary): string {
  const coefs = coefficientRows(m)
    .filter((r) => r.symbol !== 'μ')
    .map((r) => `${r.symbol} = ${r.estimate.toFixed(3)}${r.standardError === null ? '' : ` ± ${r.standardError.toFixed(3)}`}`);
  return coefs.length ? `${armaName(m.p, m.q)}: ${coefs.join(', ')}` : armaName(m.p, m.q);
}
