/**
 * A reproducible stream of standard normal deviates for the engine's simulations (the same seed
 * gives the same answer on every machine and run, so a result can be cached and a test can pin
 * it). Uniforms from splitmix32 (a 32-bit variant of Steele, Lea & Flood's SplitMix, OOPSLA 2014,
 * with the output mix of MurmurHash3's finaliser), turned into normals by the Box–Muller
 * transform (Box & Muller 1958, Ann. Math. Statist. 29:610–611), both deviates of each pair used.
 *
 * Cost: O(1) per deviate.
 */
export function seededNormalStream(seed: number): () => number {
  let state = seed >>> 0;
  const uniform = () => {
    state = (state + 0x9e3779b9) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    z ^= z >>> 16;
    // (0, 1]: never 0, so the logarithm below is finite.
    return ((z >>> 0) + 1) / 4294967296;
  };
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    const radius = Math.sqrt(-2 * Math.log(uniform()));
    const angle = 2 * Math.PI * uniform();
    spare = radius * Math.sin(angle);
    return radius * Math.cos(angle);
  };
}
