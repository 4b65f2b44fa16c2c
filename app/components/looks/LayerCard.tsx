// One layer in a channel's stack: a header to switch it on and off, move it (buttons, Alt+↑/↓ or
// drag) and remove it, and its fields when opened. Memoised: with hundreds of layers, typing in
// one must not re-render the others.
import { memo, useRef, useState } from "react";
import type { Diagnostic } from "~/lib/checks/diagnostics";
import type { Channel, Layer } from "~/lib/config/schema";
import type { EditorAction } from "~/lib/looks/editor-state";
import { layerPath } from "~/lib/looks/diagnostic-index";
import { DiagnosticList } from "./controls";
import { LayerFields } from "./LayerFields";
import { dragProps, reorderKey } from "./reorder";

export const KIND_LABELS: Record<Layer["kind"], string> = {
  fill: "Fill",
  gradient: "Gradient",
  drift: "Drift",
  breathe: "Breathe",
  shimmer: "Shimmer",
  spark: "Spark",
  hold: "Hold",
  wipe: "Wipe",
  mirror: "Mirror",
};

export const KIND_HINTS: Record<Layer["kind"], string> = {
  fill: "one colour",
  gradient: "colours along the length",
  drift: "moving bands",
  breathe: "slow pulse",
  shimmer: "random flicker",
  spark: "brief flash on an event",
  hold: "while an event lasts",
  wipe: "ignition or retraction transition",
  mirror: "repeat another channel",
};

function swatch(layer: Layer): string | null {
  switch (layer.kind) {
    case "fill":
    case "breathe":
    case "shimmer":
    case "spark":
    case "hold":
      return layer.color;
    case "gradient":
      return `linear-gradient(90deg, ${layer.stops.map((s) => s.color).join(", ")})`;
    case "drift":
      return `linear-gradient(90deg, ${layer.colors.join(", ")})`;
    default:
      return null;
  }
}

function summary(layer: Layer, channels: readonly Channel[]): string {
  switch (layer.kind) {
    case "spark":
      return `on ${layer.event}, ${layer.decayMs} ms`;
    case "hold":
      return `while ${layer.event}`;
    case "wipe":
      return `${layer.event}, ${layer.durationMs} ms`;
    case "breathe":
      return `${layer.periodMs} ms`;
    case "shimmer":
      return `${layer.rateHz} Hz`;
    case "drift":
      return `${layer.speedPixelsPerSecond} px/s`;
    case "mirror":
      return `of ${channels.find((c) => c.id === layer.channelId)?.name ?? layer.channelId}`;
    default:
      return layer.kind === "fill" ? layer.color : "";
  }
}

type Props = {
  presetId: string;
  presetIndex: number;
  channel: Channel;
  channels: readonly Channel[];
  index: number;
  count: number;
  layer: Layer;
  /** Diagnostics anywhere inside this layer (for the header's badge and to re-render when they change). */
  diagnostics: readonly Diagnostic[];
  readOnly: boolean;
  startOpen: boolean;
  dispatch: (a: EditorAction) => void;
};

function LayerCardImpl({ presetId, presetIndex, channel, channels, index, count, layer, diagnostics, readOnly, startOpen, dispatch }: Props) {
  const [open, setOpen] = useState(startOpen);
  const header = useRef<HTMLDivElement>(null);
  const base = { presetId, channelId: channel.id };
  const move = (from: number, to: number) => {
    dispatch({ type: "layer/move", ...base, from, to });
    // Keep the keyboard on the layer that moved.
    requestAnimationFrame(() => document.getElementById(`layer-${channel.id}-${to}`)?.focus());
  };
  const path = (...f: (string | number)[]) => layerPath(presetIndex, channel.id, index, ...f);
  const name = `${KIND_LABELS[layer.kind]} layer ${index + 1}`;
  const errors = diagnostics.filter((d) => d.severity === "error").length;
  const warnings = diagnostics.length - errors;
  const sw = swatch(layer);
  const own = diagnostics.filter((d) => d.path === path());
  return (
    <li
      className={`rounded-md border ${errors ? "border-signal-error/60" : warnings ? "border-signal-warning/50" : "border-soot-600"} bg-soot-800/60`}
      data-testid="layer"
      data-kind={layer.kind}
      {...dragProps("layer", `${presetId}|${channel.id}`, index, move, !readOnly)}
    >
      <div
        ref={header}
        id={`layer-${channel.id}-${index}`}
        tabIndex={-1}
        className="flex flex-wrap items-center gap-2 px-2 py-1.5"
        onKeyDown={(e) => !readOnly && reorderKey(e, index, count, move)}
      >
        {readOnly ? null : (
          <span aria-hidden="true" className="cursor-grab select-none text-iron-400" title="Drag to reorder">
            ⋮⋮
          </span>
        )}
        <input
          type="checkbox"
          className="accent-ember-500"
          checked={layer.enabled}
          disabled={readOnly}
          aria-label={`${name} enabled`}
          onChange={() => dispatch({ type: "layer/toggle", ...base, index })}
        />
        {sw ? <span aria-hidden="true" className="inline-block h-3 w-5 rounded-sm border border-soot-600" style={{ background: sw }} /> : null}
        <button
          type="button"
          className={`flex-1 text-left text-sm ${layer.enabled ? "" : "text-iron-400 line-through"}`}
          aria-expanded={open}
          aria-label={`${name}: ${summary(layer, channels)}`}
          onClick={() => setOpen(!open)}
        >
          <span className="font-medium">{index + 1}. {KIND_LABELS[layer.kind]}</span> <span className="text-xs text-iron-400">{summary(layer, channels)}</span>
          {errors ? <span className="ml-2 text-xs text-signal-error">{errors} error{errors > 1 ? "s" : ""}</span> : null}
          {warnings ? <span className="ml-2 text-xs text-signal-warning">{warnings} warning{warnings > 1 ? "s" : ""}</span> : null}
        </button>
        {readOnly ? null : (
          <span className="flex gap-1">
            <button type="button" className="btn px-2 py-0.5" aria-label={`Move ${name} up`} title="Move up (Alt+↑)" disabled={index === 0} onClick={() => move(index, index - 1)}>
              ↑
            </button>
            <button type="button" className="btn px-2 py-0.5" aria-label={`Move ${name} down`} title="Move down (Alt+↓)" disabled={index === count - 1} onClick={() => move(index, index + 1)}>
              ↓
            </button>
            <button type="button" className="btn btn-danger px-2 py-0.5" aria-label={`Remove ${name}`} onClick={() => dispatch({ type: "layer/remove", ...base, index })}>
              ✕
            </button>
          </span>
        )}
      </div>
      <DiagnosticList items={own} className="px-2 pb-1" />
      {open ? (
        <div className="border-t border-soot-700 p-3">
          <LayerFields
            layer={layer}
            channel={channel}
            channels={channels}
            path={path}
            patch={(patch, field) => dispatch({ type: "layer/update", ...base, index, patch, key: `${presetId}|${channel.id}|${index}|${field}` })}
          />
        </div>
      ) : null}
    </li>
  );
}

const sameDiagnostics = (a: readonly Diagnostic[], b: readonly Diagnostic[]) =>
  a.length === b.length && a.every((d, i) => d.path === b[i].path && d.code === b[i].code && d.message === b[i].message);

export const LayerCard = memo(LayerCardImpl, (a, b) =>
  a.layer === b.layer &&
  a.index === b.index &&
  a.count === b.count &&
  a.presetId === b.presetId &&
  a.presetIndex === b.presetIndex &&
  a.channel === b.channel &&
  a.channels === b.channels &&
  a.readOnly === b.readOnly &&
  a.dispatch === b.dispatch &&
  sameDiagnostics(a.diagnostics, b.diagnostics),
);
