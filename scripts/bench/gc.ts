// A full collection before a timing window, when the process runs with --expose-gc (the bench
// runner passes it): each figure then starts from a collected heap instead of paying for the
// garbage the previous figure left behind.
export function collect(): void {
  (globalThis as { gc?: () => void }).gc?.();
}
