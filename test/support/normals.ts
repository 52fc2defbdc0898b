/**
 * Deterministic standard normals for tests: a linear congruential generator (the Numerical Recipes
 * constants, from memory) through the Box-Muller transform, so a seeded test sees the same noise every run.
 */
export function normals(seed: number): () => number {
  let s = seed >>> 0;
  const uniform = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
}
