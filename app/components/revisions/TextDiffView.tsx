// The text diff of two rendered outputs: unified (one column, old and new line numbers) or side
// by side, with the changed words marked inside changed lines.
import type { Hunk, Segment, TextDiff } from "~/lib/text-diff/text-diff";

function Words({ text, words, kind }: { text: string; words?: Segment[]; kind: "removed" | "added" | "context" }) {
  if (!words) return <>{text || " "}</>;
  const mark = kind === "removed" ? "bg-signal-error/40" : "bg-signal-ok/40";
  return (
    <>
      {words.map((w, i) =>
        w.changed ? (
          <mark key={i} className={`${mark} rounded-sm text-inherit`} data-changed-word>
            {w.text}
          </mark>
        ) : (
          <span key={i}>{w.text}</span>
        ),
      )}
    </>
  );
}

const tone = { context: "", removed: "bg-signal-error/10", added: "bg-signal-ok/10" } as const;
const sign = { context: " ", removed: "-", added: "+" } as const;

function HunkHeader({ h }: { h: Hunk }) {
  return (
    <tr className="text-iron-400">
      <td colSpan={4} className="py-1">
        @@ −{h.oldStart},{h.oldLines} +{h.newStart},{h.newLines} @@
      </td>
    </tr>
  );
}

const LineNo = ({ n }: { n: number | string | undefined }) => <td className="w-10 select-none pr-2 text-right text-iron-500">{n ?? ""}</td>;

function Unified({ hunks }: { hunks: Hunk[] }) {
  return (
    <table className="w-full font-mono text-xs" data-testid="text-diff-unified">
      <tbody>
        {hunks.map((h, hi) => [
          <HunkHeader key={`h${hi}`} h={h} />,
          ...h.rows.map((r, ri) => (
            <tr key={`${hi}-${ri}`} className={tone[r.kind]} data-kind={r.kind}>
              <LineNo n={r.kind !== "added" ? r.oldNo : ""} />
              <LineNo n={r.kind !== "removed" ? r.newNo : ""} />
              <td className="w-4 select-none">{sign[r.kind]}</td>
              <td className="whitespace-pre-wrap break-all">
                <Words text={r.text} words={r.kind === "context" ? undefined : r.words} kind={r.kind} />
              </td>
            </tr>
          )),
        ])}
      </tbody>
    </table>
  );
}

function SideBySide({ hunks }: { hunks: Hunk[] }) {
  return (
    <table className="w-full table-fixed font-mono text-xs" data-testid="text-diff-side">
      <tbody>
        {hunks.map((h, hi) => [
          <HunkHeader key={`h${hi}`} h={h} />,
          ...h.side.map((s, si) => (
            <tr key={`${hi}-${si}`}>
              <LineNo n={s.left?.no} />
              <td className={`whitespace-pre-wrap break-all ${s.left ? tone[s.left.kind] : ""}`} data-side="old">
                {s.left ? <Words text={s.left.text} words={s.left.words} kind={s.left.kind} /> : null}
              </td>
              <LineNo n={s.right?.no} />
              <td className={`whitespace-pre-wrap break-all ${s.right ? tone[s.right.kind] : ""}`} data-side="new">
                {s.right ? <Words text={s.right.text} words={s.right.words} kind={s.right.kind} /> : null}
              </td>
            </tr>
          )),
        ])}
      </tbody>
    </table>
  );
}

export function TextDiffView({ diff, view }: { diff: TextDiff; view: "unified" | "side" }) {
  if (diff.kind === "same") return <p className="text-sm text-iron-300">The rendered outputs are the same.</p>;
  if (diff.kind === "too-large") return <p className="text-sm text-signal-warning">The outputs differ in more than {diff.limit} lines; compare nearer revisions.</p>;
  return (
    <div className="space-y-2">
      <p className="text-sm text-iron-300">
        <span className="text-signal-ok">+{diff.added}</span> <span className="text-signal-error">−{diff.removed}</span> lines
      </p>
      <div className="overflow-x-auto rounded-md border border-soot-700 p-2" tabIndex={0} role="region" aria-label="Text diff">{view === "side" ? <SideBySide hunks={diff.hunks} /> : <Unified hunks={diff.hunks} />}</div>
    </div>
  );
}
