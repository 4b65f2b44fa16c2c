// Budgets for untrusted templates. Each is charged where the work happens, and exceeding one
// stops the render with an error that names the limit.

export interface Limits {
  /** Template source size, in UTF-16 code units. */
  maxSourceLength: number;
  /** Nesting of blocks and parentheses. */
  maxDepth: number;
  /** Nested partial expansions (pieces and other templates). */
  maxPartialDepth: number;
  /** Partial expansions at compile time, summed over the whole template. */
  maxExpansions: number;
  /** Nodes and expressions checked and compiled, with pieces and other templates expanded where
   * they are used: bounds the work of compiling, which a piece used many times multiplies. */
  maxCompileNodes: number;
  /** Loop iterations, partial uses and filter calls at render time. */
  maxSteps: number;
  /** Output size, in UTF-16 code units. */
  maxOutput: number;
  /** Wall time of one render, in milliseconds. */
  maxMillis: number;
  /** Largest width or digit count a filter argument may ask for. */
  maxFilterWidth: number;
}

export const DEFAULT_LIMITS: Readonly<Limits> = Object.freeze({
  maxSourceLength: 256 * 1024,
  maxDepth: 64,
  maxPartialDepth: 16,
  maxExpansions: 2000,
  maxCompileNodes: 100_000,
  maxSteps: 1_000_000,
  maxOutput: 4 * 1024 * 1024,
  maxMillis: 2000,
  maxFilterWidth: 1000,
});
