// The hardware sheet must agree with the board and with itself: pins the board really has, one
// channel per data line, no more pixels on a line than the board can drive, ranges that fit.
import { pathOf, type LayerCheck, type RuleContext } from "./context";

export function rigRules(ctx: RuleContext): void {
  const { config, sink } = ctx;
  const { board, channels, buttons } = config.rig;
  const dataPins = new Set(board.dataPins);
  const inputPins = new Set(board.inputPins);

  const channelOnPin = new Map<number, number>();
  // Parallel strips hang on one data line and receive the same bytes, so a channel's pixels
  // count once against the line however many strips it has.
  const pixelsOnPin = new Map<number, number>();
  channels.forEach((c, i) => {
    const path = `rig.channels[${i}].pin`;
    if (!dataPins.has(c.pin)) sink.error("unknown-data-pin", path, `Channel "${c.name}" is on pin ${c.pin}, which is not a data pin of ${board.profile}.`, `Use one of the board's data pins: ${board.dataPins.join(", ")}.`);
    const first = channelOnPin.get(c.pin);
    if (first !== undefined) sink.error("shared-data-pin", path, `Channel "${c.name}" shares pin ${c.pin} with channel "${channels[first].name}".`, "Give each channel its own data pin; strips showing the same thing belong in one channel as parallel strips.");
    else channelOnPin.set(c.pin, i);
    pixelsOnPin.set(c.pin, (pixelsOnPin.get(c.pin) ?? 0) + c.pixels);
  });
  const reported = new Set<number>();
  channels.forEach((c, i) => {
    const total = pixelsOnPin.get(c.pin) ?? 0;
    if (total > board.maxPixelsPerPin && !reported.has(c.pin)) {
      reported.add(c.pin);
      sink.error("too-many-pixels-on-pin", `rig.channels[${i}].pixels`, `Pin ${c.pin} drives ${total} pixels; the board can drive at most ${board.maxPixelsPerPin} on one pin.`, "Shorten the strip or move pixels to another data pin.");
    }
  });

  const buttonOnPin = new Map<number, number>();
  buttons.forEach((b, i) => {
    const path = `rig.buttons[${i}].pin`;
    if (!inputPins.has(b.pin)) sink.error("unknown-input-pin", path, `Button "${b.name}" is on pin ${b.pin}, which is not an input pin of ${board.profile}.`, board.inputPins.length ? `Use one of the board's input pins: ${board.inputPins.join(", ")}.` : "This board profile lists no input pins; check the profile.");
    const first = buttonOnPin.get(b.pin);
    if (first !== undefined) sink.error("shared-input-pin", path, `Button "${b.name}" shares pin ${b.pin} with button "${buttons[first].name}".`, "Wire each button to its own input pin.");
    else buttonOnPin.set(b.pin, i);
    const ch = channelOnPin.get(b.pin);
    if (ch !== undefined) sink.error("pin-used-as-data-and-input", path, `Pin ${b.pin} carries both button "${b.name}" and channel "${channels[ch].name}".`, "One pin cannot read a button and drive LEDs; move one of them.");
  });
}

export const rigLayerCheck: LayerCheck = (ctx, layer, at, channel) => {
  const { sink } = ctx;
  if (channel.pixels === 1 && (layer.kind === "gradient" || layer.kind === "drift"))
    sink.warning("pattern-on-one-pixel", pathOf(at), `A ${layer.kind} on "${channel.name}", which has one pixel, shows only a single colour.`, layer.kind === "gradient" ? "Use a fill with the colour you want." : "Use a breathe or fill instead.");
  if (layer.range) {
    const { start, end } = layer.range;
    if (end <= start) sink.error("empty-range", pathOf(at, "range"), `The range ${start}–${end} covers no pixels (end must be past start).`, "Set end to one past the last pixel the layer should cover.");
    else if (end > channel.pixels)
      sink.warning("range-beyond-channel", pathOf(at, "range"), start >= channel.pixels ? `The range ${start}–${end} starts past the end of "${channel.name}" (${channel.pixels} pixels), so the layer never shows.` : `The range ${start}–${end} runs past the end of "${channel.name}" (${channel.pixels} pixels); the rest is cut off.`, `Keep the range within 0–${channel.pixels}.`);
  }
  if (layer.kind === "gradient") {
    for (let s = 1; s < layer.stops.length; s++) {
      if (layer.stops[s].at < layer.stops[s - 1].at) {
        sink.warning("gradient-stops-out-of-order", pathOf(at, `stops[${s}].at`), `Gradient stop ${s} (at ${layer.stops[s].at}) comes before stop ${s - 1} (at ${layer.stops[s - 1].at}).`, "List stops from base (0) to tip (1).");
        break;
      }
    }
  }
};
