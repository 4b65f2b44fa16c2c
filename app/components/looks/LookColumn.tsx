// One channel's look in the selected preset: its layer stack (bottom first), adding layers of
// any kind, copying the look elsewhere, making the channel mirror another, and the stored
// time-by-pixel picture.
import { useContext, useState } from "react";
import { LAYER_KINDS, type Channel, type Config, type LayerKind, type Preset } from "~/lib/config/schema";
import type { EditorAction, LookRef } from "~/lib/looks/editor-state";
import { layerPath, lookPath, type DiagnosticIndex } from "~/lib/looks/diagnostic-index";
import { DiagnosticList, EditorContext } from "./controls";
import { KIND_HINTS, KIND_LABELS, LayerCard } from "./LayerCard";

export function LookColumn({
  config,
  preset,
  presetIndex,
  channel,
  checks,
  dispatch,
  pictureUrl,
}: {
  config: Config;
  preset: Preset;
  presetIndex: number;
  channel: Channel;
  checks: DiagnosticIndex;
  dispatch: (a: EditorAction) => void;
  /** The stored config's picture of this look, or null when this look is not stored yet. */
  pictureUrl: string | null;
}) {
  const { readOnly } = useContext(EditorContext);
  const [kind, setKind] = useState<LayerKind>("fill");
  const [opened, setOpened] = useState<number | null>(null);
  const layers = preset.looks[channel.id]?.layers ?? [];
  const channels = config.rig.channels;
  const lp = lookPath(presetIndex, channel.id);
  const headingId = `look-${channel.id}-heading`;
  return (
    <section className="card min-w-0 space-y-3" aria-labelledby={headingId} data-testid={`look-${channel.id}`}>
      <header>
        <h3 id={headingId}>{channel.name}</h3>
        <p className="text-xs text-iron-400">
          {channel.role} · {channel.pixels} px{channel.parallelStrips > 1 ? ` × ${channel.parallelStrips} strips` : ""} · {layers.length} layer{layers.length === 1 ? "" : "s"}
        </p>
        <DiagnosticList items={checks.at(lp).concat(checks.at(`${lp}.layers`))} />
      </header>

      {layers.length === 0 ? <p className="text-sm text-iron-400">No layers: this channel stays dark.</p> : null}
      {layers.length > 0 ? <p className="text-xs text-iron-400">Bottom of the stack first; each layer paints over the ones before it.</p> : null}
      <ol className="space-y-2" aria-label={`${channel.name} layers`}>
        {layers.map((layer, i) => (
          <LayerCard
            key={i}
            presetId={preset.id}
            presetIndex={presetIndex}
            channel={channel}
            channels={channels}
            index={i}
            count={layers.length}
            layer={layer}
            diagnostics={checks.under(layerPath(presetIndex, channel.id, i))}
            readOnly={readOnly}
            startOpen={opened === i}
            dispatch={dispatch}
          />
        ))}
      </ol>

      {readOnly ? null : (
        <div className="flex flex-wrap items-end gap-2">
          <div>
            <label className="label" htmlFor={`add-${channel.id}`}>
              New layer
            </label>
            <select id={`add-${channel.id}`} className="field" value={kind} onChange={(e) => setKind(e.currentTarget.value as LayerKind)}>
              {LAYER_KINDS.map((k) => (
                <option key={k} value={k}>
                  {KIND_LABELS[k]} — {KIND_HINTS[k]}
                </option>
              ))}
            </select>
          </div>
          <button
            type="button"
            className="btn"
            onClick={() => {
              setOpened(layers.length);
              dispatch({ type: "layer/add", presetId: preset.id, channelId: channel.id, kind });
            }}
          >
            Add to {channel.name}
          </button>
        </div>
      )}

      {readOnly ? null : <LookTools config={config} preset={preset} channel={channel} dispatch={dispatch} />}

      {pictureUrl ? (
        <figure className="space-y-1">
          <img
            src={pictureUrl}
            alt={`Time-by-pixel picture of ${channel.name} in ${preset.name} as saved: the demonstration sequence over 7.5 seconds from top to bottom, base on the left.`}
            width={channel.pixels}
            height={450}
            loading="lazy"
            className="h-56 rounded-sm border border-soot-600 bg-black"
            style={{ width: Math.max(24, Math.min(260, channel.pixels * 1.5)), imageRendering: "pixelated" }}
          />
          <figcaption className="text-xs text-iron-400">As saved · time runs down, 7.5 s</figcaption>
        </figure>
      ) : (
        <p className="text-xs text-iron-400">The time-by-pixel picture appears once this look is saved.</p>
      )}
    </section>
  );
}

function LookTools({ config, preset, channel, dispatch }: { config: Config; preset: Preset; channel: Channel; dispatch: (a: EditorAction) => void }) {
  const [targets, setTargets] = useState<Set<string>>(new Set());
  const [source, setSource] = useState("");
  const others = config.rig.channels.filter((c) => c.id !== channel.id);
  const key = (r: LookRef) => `${r.presetId}|${r.channelId}`;
  const toggle = (r: LookRef, on: boolean) =>
    setTargets((t) => {
      const n = new Set(t);
      if (on) n.add(key(r));
      else n.delete(key(r));
      return n;
    });
  const box = (r: LookRef, label: string) => (
    <label key={key(r)} className="flex items-center gap-2 text-sm">
      <input type="checkbox" className="accent-ember-500" checked={targets.has(key(r))} onChange={(e) => toggle(r, e.currentTarget.checked)} />
      {label}
    </label>
  );
  return (
    <details className="rounded-md border border-soot-700 p-2">
      <summary className="cursor-pointer text-sm text-iron-300">Copy or mirror this look</summary>
      <div className="mt-2 space-y-3">
        <fieldset className="space-y-1">
          <legend className="label">Copy to other presets ({channel.name})</legend>
          {config.presets.filter((p) => p.id !== preset.id).map((p) => box({ presetId: p.id, channelId: channel.id }, p.name))}
        </fieldset>
        {others.length ? (
          <fieldset className="space-y-1">
            <legend className="label">Copy to other channels ({preset.name})</legend>
            {others.map((c) => box({ presetId: preset.id, channelId: c.id }, c.name))}
          </fieldset>
        ) : null}
        <button
          type="button"
          className="btn"
          disabled={targets.size === 0}
          onClick={() => {
            const to = [...targets].map((k) => {
              const [presetId, channelId] = k.split("|");
              return { presetId, channelId };
            });
            dispatch({ type: "look/copy", from: { presetId: preset.id, channelId: channel.id }, to });
            setTargets(new Set());
          }}
        >
          Copy look to {targets.size || "…"} {targets.size === 1 ? "place" : "places"}
        </button>
        {others.length ? (
          <div className="flex flex-wrap items-end gap-2 border-t border-soot-700 pt-3">
            <div>
              <label className="label" htmlFor={`mirror-${channel.id}`}>
                Mirror another channel
              </label>
              <select id={`mirror-${channel.id}`} className="field" value={source} onChange={(e) => setSource(e.currentTarget.value)}>
                <option value="">Choose a channel…</option>
                {others.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.name}
                  </option>
                ))}
              </select>
            </div>
            <button
              type="button"
              className="btn"
              disabled={source === ""}
              onClick={() => dispatch({ type: "look/mirror", presetId: preset.id, channelId: channel.id, sourceChannelId: source })}
            >
              Replace with mirror
            </button>
          </div>
        ) : null}
      </div>
    </details>
  );
}
