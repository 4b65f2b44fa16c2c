// Two versions of a template side by side in one unified list: each changed line carries a
// sign and a word (added / removed) as well as a colour, and both line numbers.
import { Form, Link } from "react-router";
import type { DiffRow, VersionDiff as Diff } from "~/lib/rendering/version-diff";

export type CompareData = { from: number; to: number; diff: Diff; patchHref: string; closeHref: string };

const ROW_STYLE: Record<DiffRow["kind"], string> = {
  added: "bg-signal-ok/10",
  removed: "bg-signal-error/10",
  context: "",
};
const SIGN: Record<DiffRow["kind"], string> = { added: "+", removed: "−", context: " " };
const WORD: Record<DiffRow["kind"], string> = { added: "added", removed: "removed", context: "" };

/** "lines 4–9", "line 4", or "no lines" for the side of a hunk that holds none. */
const span = (start: number, lines: number) => (lines === 0 ? "no lines" : lines === 1 ? `line ${start}` : `lines ${start}–${start + lines - 1}`);

function Row({ row }: { row: DiffRow }) {
  const oldNo = row.kind === "added" ? "" : row.oldNo;
  const newNo = row.kind === "removed" ? "" : row.newNo;
  return (
    <tr className={ROW_STYLE[row.kind]} data-kind={row.kind}>
      <td className="w-12 select-none px-2 text-right text-iron-400">{oldNo}</td>
      <td className="w-12 select-none px-2 text-right text-iron-400">{newNo}</td>
      <td className={`w-20 select-none px-2 ${row.kind === "added" ? "text-signal-ok" : row.kind === "removed" ? "text-signal-error" : ""}`}>
        <span aria-hidden="true" className="font-bold">
          {SIGN[row.kind]}
        </span>{" "}
        <span className="text-xs">{WORD[row.kind]}</span>
      </td>
      <td className="whitespace-pre-wrap break-all px-2">
        {row.text}
        {row.noNewline ? <span className="ml-2 text-xs text-iron-400">(no line break at the end)</span> : null}
      </td>
    </tr>
  );
}

export function VersionDiff({ name, versions, compare, build }: { name: string; versions: number[]; compare: CompareData; build: string | null }) {
  const { from, to, diff } = compare;
  return (
    <section aria-labelledby="compare-h" className="card space-y-3" data-testid="compare">
      <div className="flex flex-wrap items-baseline gap-3">
        <h2 id="compare-h">
          Changes from version {from} to version {to}
        </h2>
        <Link to={compare.closeHref} className="text-sm">
          Close comparison
        </Link>
      </div>
      <Form method="get" className="flex flex-wrap items-end gap-2">
        {build ? <input type="hidden" name="build" value={build} /> : null}
        <div>
          <label className="label" htmlFor="compare-from">
            From version
          </label>
          <select id="compare-from" name="from" className="field w-28" defaultValue={from}>
            {versions.map((v) => (
              <option key={v} value={v}>
                v{v}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="compare-to">
            To version
          </label>
          <select id="compare-to" name="to" className="field w-28" defaultValue={to}>
            {versions.map((v) => (
              <option key={v} value={v}>
                v{v}
              </option>
            ))}
          </select>
        </div>
        <button type="submit" className="btn">
          Compare
        </button>
        {diff.kind !== "too-large" ? (
          <a href={compare.patchHref} download className="btn">
            Download .patch
          </a>
        ) : null}
      </Form>
      {diff.kind === "same" ? (
        <p role="status" data-testid="compare-summary">
          No changes: version {from} and version {to} of {name} are identical.
        </p>
      ) : diff.kind === "too-large" ? (
        <p role="status" data-testid="compare-summary" className="text-signal-warning">
          These versions differ in more than {diff.limit} lines (or took too long to compare), so the line-by-line view is not shown.
        </p>
      ) : (
        <>
          <p role="status" data-testid="compare-summary">
            {diff.added} {diff.added === 1 ? "line" : "lines"} added, {diff.removed} {diff.removed === 1 ? "line" : "lines"} removed.
          </p>
          <div className="overflow-auto rounded-md border border-soot-600 bg-soot-950" tabIndex={0} role="region" aria-label="Line diff">
            <table className="w-full border-collapse font-mono text-xs" aria-label={`Line changes from version ${from} to version ${to}`}>
              <thead className="sr-only">
                <tr>
                  <th scope="col">Line in v{from}</th>
                  <th scope="col">Line in v{to}</th>
                  <th scope="col">Change</th>
                  <th scope="col">Text</th>
                </tr>
              </thead>
              {diff.hunks.map((h, i) => (
                <tbody key={i}>
                  <tr className="bg-soot-800 text-iron-300">
                    <td colSpan={4} className="px-2 py-1">
                      v{from} {span(h.oldStart, h.oldLines)} → v{to} {span(h.newStart, h.newLines)}
                    </td>
                  </tr>
                  {h.rows.map((r, j) => (
                    <Row key={j} row={r} />
                  ))}
                </tbody>
              ))}
            </table>
          </div>
        </>
      )}
    </section>
  );
}
