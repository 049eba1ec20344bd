/**
 * Test-only helpers: a small seeded pseudo-random generator and ARMA simulation, so the
 * simulation tests are repeatable. Nothing in the engine imports this file.
 */

/**
 * Mulberry32, a 32-bit generator with a single 32-bit state (Tommy Ettinger, public domain,
 * 2017): uniform numbers in [0, 1). Plenty for test data; not for cryptography.
 */
export function seededUniform(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal draws by the Box–Muller transform (Box & Muller 1958, Ann. Math. Statist. 29:610). */
export function seededNormal(seed: number): () => number {
  const uniform = seededUniform(seed);
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    const u = 1 - uniform();
    const v = uniform();
    const radius = Math.sqrt(-2 * Math.log(u));
    spare = radius * Math.sin(2 * Math.PI * v);
    return radius * Math.cos(2 * Math.PI * v);
  };
}

/**
 * ARMA(p, q) sample path x_t = Σ φ_i x_{t−i} + e_t + Σ θ_j e_{t−j} with N(0, 1) shocks
 * (Box, Jenkins & Reinsel sign convention for θ as in R's arima.sim: plus), after a burn-in.
 */
export function simulateArma({ ar = [], ma = [] }: { ar?: number[]; ma?: number[] }, n: number, seed: number, burnIn = 500): Float64Array {
  const normal = seededNormal(seed);
  const total = n + burnIn;
  const x = new Float64Array(total);
  const e = new Float64Array(total);
  for (let t = 0; t < total; t++) {
    e[t] = normal();
    let v = e[t];
    for (let i = 0; i < ar.length; i++) if (t - i - 1 >= 0) v += ar[i] * x[t - i - 1];
    for (let j = 0; j < ma.length; j++) if (t - j - 1 >= 0) v += ma[j] * e[t - j - 1];
    x[t] = v;
  }
  return x.slice(burnIn);
}
