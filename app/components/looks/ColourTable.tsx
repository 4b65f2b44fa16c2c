// The live preview in words: per channel, how many pixels give light and which colours they show.
import type { Channel } from "~/lib/config/schema";
import type { FrameSummary } from "~/lib/effects/summary";

export function ColourTable({ channels, summaries, timeMs }: { channels: readonly Channel[]; summaries: Record<string, FrameSummary>; timeMs: number }) {
  return (
    <table className="w-full text-left text-sm">
      <caption className="mb-2 text-left text-xs uppercase tracking-wide text-iron-400">
        Colour values at {(timeMs / 1000).toFixed(2)} s (brightness cap applied)
      </caption>
      <thead className="text-xs text-iron-400">
        <tr>
          <th scope="col" className="py-1 pr-3 font-medium">Channel</th>
          <th scope="col" className="py-1 pr-3 font-medium">Lit</th>
          <th scope="col" className="py-1 font-medium">Colours</th>
        </tr>
      </thead>
      <tbody>
        {channels.map((c) => {
          const s = summaries[c.id];
          return (
            <tr key={c.id} className="border-t border-soot-700 align-top">
              <th scope="row" className="py-1.5 pr-3 font-medium">{c.name}</th>
              <td className="py-1.5 pr-3 font-mono tabular-nums">{s ? `${s.litPixels} / ${s.pixels}` : "–"}</td>
              <td className="py-1.5">
                <ul className="flex flex-wrap gap-x-4 gap-y-1">
                  {s?.samples.map((x) => (
                    <li key={x.label} className="inline-flex items-center gap-1.5">
                      <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm border border-soot-600" style={{ background: x.hex }} />
                      <span className="text-iron-400">{x.label}</span> <span className="font-mono">{x.hex}</span>
                    </li>
                  ))}
                </ul>
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
