// The bench check as a list of toggle buttons, one per item: Tab to an item, Space or Enter to
// tick it. Each saves at once through its own fetcher (the page does not reload); without
// JavaScript each is a plain form that posts and comes back to the page.
import { useFetcher } from "react-router";
import type { BenchCheck, CheckedItem } from "~/lib/release/rules";

function when(iso: string) {
  return `${iso.slice(0, 16).replace("T", " ")} UTC`;
}

function Item({ item, revision, editable }: { item: CheckedItem; revision: number; editable: boolean }) {
  const fetcher = useFetcher<{ ok: boolean; error?: string }>();
  // While the save is on its way, show what was asked (the server's answer follows).
  const pending = fetcher.formData?.get("ticked");
  const ticked = pending !== undefined && pending !== null ? pending === "1" : item.tick !== null;
  const failed = fetcher.data && !fetcher.data.ok ? fetcher.data.error : null;
  const hintId = `bench-hint-${item.key.replace(/[^a-z0-9-]/gi, "_")}`;
  const body = (
    <>
      <span aria-hidden="true" className={`mt-0.5 inline-flex h-4 w-4 shrink-0 items-center justify-center rounded border ${ticked ? "border-signal-ok bg-signal-ok text-soot-950" : "border-iron-400"}`}>
        {ticked ? "✓" : ""}
      </span>
      <span className="text-left">{item.label}</span>
    </>
  );
  return (
    <li className="py-1.5" data-testid="bench-item" data-key={item.key} data-ticked={ticked ? "1" : "0"}>
      {editable ? (
        <fetcher.Form method="post" className="inline">
          <input type="hidden" name="intent" value="tick" />
          <input type="hidden" name="revision" value={revision} />
          <input type="hidden" name="item" value={item.key} />
          <input type="hidden" name="ticked" value={ticked ? "0" : "1"} />
          <button type="submit" aria-pressed={ticked} aria-describedby={item.hint || item.tick ? hintId : undefined} className="flex items-start gap-2 rounded px-1 text-sm hover:bg-soot-800">
            {body}
          </button>
        </fetcher.Form>
      ) : (
        <span className="flex items-start gap-2 px-1 text-sm">
          {body}
          <span className="sr-only">{ticked ? "(ticked)" : "(not ticked)"}</span>
        </span>
      )}
      <p id={hintId} className="ml-7 text-xs text-iron-400">
        {item.commonPractice ? <strong className="mr-1 text-brass-300">Common practice.</strong> : null}
        {item.hint ?? ""}
        {item.tick ? ` Ticked by ${item.tick.by ?? "a former member"}, ${when(item.tick.at)}.` : ""}
      </p>
      {failed ? (
        <p role="alert" className="ml-7 text-xs text-signal-error">
          {failed}
        </p>
      ) : null}
    </li>
  );
}

export function BenchChecklist({ check, editable }: { check: BenchCheck; editable: boolean }) {
  return (
    <div className="space-y-4" data-testid="bench-check">
      {check.groups.map((g) => (
        <section key={g.key} aria-labelledby={`bench-group-${g.key.replace(/[^a-z0-9-]/gi, "_")}`} className="card">
          <h4 id={`bench-group-${g.key.replace(/[^a-z0-9-]/gi, "_")}`} className="font-medium">
            {g.title}
          </h4>
          <ul className="mt-2">
            {g.items.map((i) => (
              <Item key={i.key} item={i} revision={check.revision} editable={editable} />
            ))}
          </ul>
        </section>
      ))}
    </div>
  );
}
