// HTTP Range for one byte range (RFC 9110 §14): "bytes=a-b", "bytes=a-" and "bytes=-n". Several
// ranges at once are answered with the whole file, which the RFC allows.
export type RangeAnswer = { kind: "whole" } | { kind: "part"; start: number; end: number } | { kind: "unsatisfiable" };

export function parseRange(header: string | null, size: number): RangeAnswer {
  if (!header) return { kind: "whole" };
  const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim());
  if (!m || (m[1] === "" && m[2] === "")) return { kind: "whole" };
  if (size === 0) return { kind: "unsatisfiable" };
  let start: number;
  let end: number;
  if (m[1] === "") {
    const n = Number(m[2]);
    if (n === 0) return { kind: "unsatisfiable" };
    start = Math.max(0, size - n);
    end = size - 1;
  } else {
    start = Number(m[1]);
    end = m[2] === "" ? size - 1 : Math.min(Number(m[2]), size - 1);
    if (start >= size || end < start) return { kind: "unsatisfiable" };
  }
  return { kind: "part", start, end };
}
