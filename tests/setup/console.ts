// An unexpected console.error fails the test that printed it.
import { afterEach, vi } from "vitest";

let errors: unknown[][] = [];
const original = console.error;
console.error = (...args: unknown[]) => {
  errors.push(args);
  original(...args);
};
afterEach(() => {
  const seen = errors;
  errors = [];
  if (seen.length > 0) throw new Error(`console.error was called: ${String(seen[0]?.[0])}`);
});
export { vi };
