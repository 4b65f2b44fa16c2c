// The fields of one layer, by kind: colours as pickers with hex text, times and sizes as sliders
// with typed numbers and units, events, blend, when and range as choices.
import { useContext } from "react";
import { BLEND_MODES, EASINGS, LASTING_EVENTS, MOMENT_EVENTS, type Channel, type Layer, type LayerOf } from "~/lib/config/schema";
import { ChoiceInput, ColourInput, EditorContext, NumberInput } from "./controls";

export type Patch = (patch: Partial<Layer>, field: string) => void;

const WHEN_LABELS = { always: "always", lit: "while lit", unlit: "while unlit" } as const;

function Common({ layer, channel, path, patch }: { layer: Layer; channel: Channel; path: (...f: (string | number)[]) => string; patch: Patch }) {
  const { readOnly } = useContext(EditorContext);
  const range = layer.range;
  return (
    <div className="grid gap-3 sm:grid-cols-2">
      <NumberInput label="Opacity" unit="%" value={Math.round(layer.opacity * 1000) / 10} path={path("opacity")} min={0} max={100} step={1} onChange={(v) => patch({ opacity: v / 100 }, "opacity")} />
      <ChoiceInput label="Blend" value={layer.blend} path={path("blend")} options={BLEND_MODES} onChange={(blend) => patch({ blend }, "blend")} />
      <ChoiceInput label="When" value={layer.when} path={path("when")} options={["always", "lit", "unlit"] as const} labels={WHEN_LABELS} onChange={(when) => patch({ when }, "when")} />
      <div data-path={path("range")}>
        <label className="inline-flex items-center gap-2 text-sm">
          <input
            type="checkbox"
            className="accent-ember-500"
            checked={range !== undefined}
            disabled={readOnly}
            onChange={(e) => patch({ range: e.currentTarget.checked ? { start: 0, end: channel.pixels } : undefined }, "range")}
          />
          Only some pixels
        </label>
        {range ? (
          <div className="mt-2 grid grid-cols-2 gap-2">
            <NumberInput label="From pixel" value={range.start} path={path("range", "start")} min={0} max={channel.pixels - 1} integer slider={false} onChange={(start) => patch({ range: { ...range, start } }, "range.start")} />
            <NumberInput label="To pixel" unit="exclusive" value={range.end} path={path("range", "end")} min={1} max={channel.pixels} integer slider={false} onChange={(end) => patch({ range: { ...range, end } }, "range.end")} />
          </div>
        ) : null}
      </div>
    </div>
  );
}

function ColourList({ colours, path, onChange, min, max, name }: { colours: string[]; path: (...f: (string | number)[]) => string; onChange: (c: string[]) => void; min: number; max: number; name: string }) {
  const { readOnly } = useContext(EditorContext);
  return (
    <fieldset className="space-y-2">
      <legend className="label">{name}</legend>
      {colours.map((c, i) => (
        <div key={i} className="flex items-end gap-2">
          <ColourInput label={`Band ${i + 1}`} value={c} path={path("colors", i)} onChange={(v) => onChange(colours.map((x, j) => (j === i ? v : x)))} />
          {!readOnly && colours.length > min ? (
            <button type="button" className="btn btn-danger mb-0.5" aria-label={`Remove band ${i + 1}`} onClick={() => onChange(colours.filter((_, j) => j !== i))}>
              ✕
            </button>
          ) : null}
        </div>
      ))}
      {!readOnly && colours.length < max ? (
        <button type="button" className="btn" onClick={() => onChange([...colours, colours[colours.length - 1] ?? "#ffffff"])}>
          Add band
        </button>
      ) : null}
    </fieldset>
  );
}

function Stops({ layer, path, patch }: { layer: LayerOf<"gradient">; path: (...f: (string | number)[]) => string; patch: Patch }) {
  const { readOnly } = useContext(EditorContext);
  const set = (stops: LayerOf<"gradient">["stops"], field: string) => patch({ stops }, field);
  return (
    <fieldset className="space-y-2" data-path={path("stops")}>
      <legend className="label">Stops (0 = base, 100 % = tip)</legend>
      {layer.stops.map((s, i) => (
        <div key={i} className="grid items-end gap-2 sm:grid-cols-[1fr_auto_auto]">
          <NumberInput label={`Stop ${i + 1} at`} unit="%" value={Math.round(s.at * 1000) / 10} path={path("stops", i, "at")} min={0} max={100} onChange={(v) => set(layer.stops.map((x, j) => (j === i ? { ...x, at: v / 100 } : x)), `stops.${i}.at`)} />
          <ColourInput label={`Stop ${i + 1} colour`} value={s.color} path={path("stops", i, "color")} onChange={(color) => set(layer.stops.map((x, j) => (j === i ? { ...x, color } : x)), `stops.${i}.color`)} />
          {!readOnly && layer.stops.length > 2 ? (
            <button type="button" className="btn btn-danger mb-0.5" aria-label={`Remove stop ${i + 1}`} onClick={() => set(layer.stops.filter((_, j) => j !== i), "stops")}>
              ✕
            </button>
          ) : null}
        </div>
      ))}
      {!readOnly && layer.stops.length < 16 ? (
        <button type="button" className="btn" onClick={() => set([...layer.stops, { at: 1, color: layer.stops[layer.stops.length - 1]?.color ?? "#ffffff" }], "stops")}>
          Add stop
        </button>
      ) : null}
    </fieldset>
  );
}

export function LayerFields({ layer, channel, channels, path, patch }: { layer: Layer; channel: Channel; channels: readonly Channel[]; path: (...f: (string | number)[]) => string; patch: Patch }) {
  const spot = (l: LayerOf<"spark"> | LayerOf<"hold">) => (
    <>
      <ColourInput label="Colour" value={l.color} path={path("color")} onChange={(color) => patch({ color }, "color")} />
      <NumberInput label="Position" unit="% of length" value={Math.round(l.position * 1000) / 10} path={path("position")} min={0} max={100} onChange={(v) => patch({ position: v / 100 }, "position")} />
      <NumberInput label="Width" unit="pixels" value={l.widthPixels} path={path("widthPixels")} min={1} max={Math.max(1, channel.pixels * 2)} integer onChange={(widthPixels) => patch({ widthPixels }, "widthPixels")} />
    </>
  );
  let own: React.ReactNode = null;
  switch (layer.kind) {
    case "fill":
      own = <ColourInput label="Colour" value={layer.color} path={path("color")} onChange={(color) => patch({ color }, "color")} />;
      break;
    case "gradient":
      own = <Stops layer={layer} path={path} patch={patch} />;
      break;
    case "drift":
      own = (
        <>
          <ColourList name="Bands" colours={layer.colors} path={path} min={2} max={8} onChange={(colors) => patch({ colors }, "colors")} />
          <NumberInput label="Band width" unit="pixels" value={layer.bandPixels} path={path("bandPixels")} min={1} max={128} integer onChange={(bandPixels) => patch({ bandPixels }, "bandPixels")} />
          <NumberInput label="Speed" unit="pixels/s" value={layer.speedPixelsPerSecond} path={path("speedPixelsPerSecond")} min={0} max={400} onChange={(speedPixelsPerSecond) => patch({ speedPixelsPerSecond }, "speedPixelsPerSecond")} />
          <ChoiceInput label="Direction" value={layer.direction} path={path("direction")} options={["to-tip", "to-base"] as const} labels={{ "to-tip": "towards the tip", "to-base": "towards the base" }} onChange={(direction) => patch({ direction }, "direction")} />
        </>
      );
      break;
    case "breathe":
      own = (
        <>
          <ColourInput label="Colour" value={layer.color} path={path("color")} onChange={(color) => patch({ color }, "color")} />
          <NumberInput label="Period" unit="ms" value={layer.periodMs} path={path("periodMs")} min={200} max={10000} step={50} onChange={(periodMs) => patch({ periodMs }, "periodMs")} />
          <NumberInput label="Floor" unit="%" value={Math.round(layer.floor * 1000) / 10} path={path("floor")} min={0} max={100} onChange={(v) => patch({ floor: v / 100 }, "floor")} />
          <NumberInput label="Ceiling" unit="%" value={Math.round(layer.ceiling * 1000) / 10} path={path("ceiling")} min={0} max={100} onChange={(v) => patch({ ceiling: v / 100 }, "ceiling")} />
        </>
      );
      break;
    case "shimmer":
      own = (
        <>
          <ColourInput label="Colour" value={layer.color} path={path("color")} onChange={(color) => patch({ color }, "color")} />
          <NumberInput label="Amount" unit="% dip" value={Math.round(layer.amount * 1000) / 10} path={path("amount")} min={0} max={100} onChange={(v) => patch({ amount: v / 100 }, "amount")} />
          <NumberInput label="Rate" unit="Hz" value={layer.rateHz} path={path("rateHz")} min={0.5} max={60} step={0.5} onChange={(rateHz) => patch({ rateHz }, "rateHz")} />
        </>
      );
      break;
    case "spark":
      own = (
        <>
          <ChoiceInput label="On event" value={layer.event} path={path("event")} options={MOMENT_EVENTS} onChange={(event) => patch({ event }, "event")} />
          {spot(layer)}
          <NumberInput label="Decay" unit="ms" value={layer.decayMs} path={path("decayMs")} min={10} max={2000} step={10} onChange={(decayMs) => patch({ decayMs }, "decayMs")} />
        </>
      );
      break;
    case "hold":
      own = (
        <>
          <ChoiceInput label="While held" value={layer.event} path={path("event")} options={LASTING_EVENTS} onChange={(event) => patch({ event }, "event")} />
          {spot(layer)}
          <NumberInput label="Flicker" unit="%" value={Math.round(layer.flicker * 1000) / 10} path={path("flicker")} min={0} max={100} onChange={(v) => patch({ flicker: v / 100 }, "flicker")} />
        </>
      );
      break;
    case "wipe":
      own = (
        <>
          <ChoiceInput label="On event" value={layer.event} path={path("event")} options={["ignition", "retraction"] as const} onChange={(event) => patch({ event }, "event")} />
          <NumberInput label="Duration" unit="ms" value={layer.durationMs} path={path("durationMs")} min={50} max={3000} step={10} onChange={(durationMs) => patch({ durationMs }, "durationMs")} />
          <ChoiceInput label="Easing" value={layer.easing} path={path("easing")} options={EASINGS} onChange={(easing) => patch({ easing }, "easing")} />
        </>
      );
      break;
    case "mirror": {
      const others = channels.filter((c) => c.id !== channel.id).map((c) => c.id);
      own = (
        <>
          <ChoiceInput
            label="Repeat channel"
            value={layer.channelId}
            path={path("channelId")}
            options={others}
            labels={Object.fromEntries(channels.map((c) => [c.id, c.name]))}
            onChange={(channelId) => patch({ channelId }, "channelId")}
          />
          <ChoiceInput label="Fit" value={layer.fit} path={path("fit")} options={["stretch", "crop"] as const} labels={{ stretch: "stretch to length", crop: "crop from base" }} onChange={(fit) => patch({ fit }, "fit")} />
        </>
      );
      break;
    }
  }
  return (
    <div className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2">{own}</div>
      <Common layer={layer} channel={channel} path={path} patch={patch} />
    </div>
  );
}
