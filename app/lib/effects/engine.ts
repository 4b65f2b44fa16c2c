// The effect engine: turns a look, a channel, a time and a timeline into one frame of pixel
// values. Pure and deterministic; the browser preview, the server's pictures and the power
// figures all run this same code.
//
// Semantics (the contract the preview, the validator and the handoff pictures rely on):
// - A frame is RGB bytes per pixel, base first, in sRGB-encoded values — what a config colour
//   means — in R, G, B order whatever the channel's colour order (wiring order is the template's
//   business). Parallel strips show the same data, so a channel renders `pixels` once.
// - Layers composite bottom to top over opaque black in linear light (decision 002); the rig's
//   brightness cap scales the encoded values last, so current estimates scale with the cap.
// - A layer lays itself out over its range (clipped to the channel): gradient stops, spark and
//   hold positions, wipes and mirrors run from the range's first pixel to its last.
// - Blade state: unlit before the first ignition; lit from an ignition until the next retraction.
//   `when: "lit" | "unlit"` layers follow that state.
// - Main-blade channels are dark whenever the blade is unlit, except while a retraction wipe of
//   their own look is still running; during that run the look renders as if lit and the wipe
//   withdraws it from tip to base. So a main-blade look without wipes switches on at full length
//   at the ignition instant and off at the retraction instant.
// - A wipe masks everything beneath it in the stack (not what lies above it). An ignition wipe
//   reveals base → tip over its duration after the ignition; a retraction wipe withdraws tip → base
//   after the retraction; each passes everything through at other times (see wipeExtent). With
//   both kinds in one look, each acts only in its own state, so they compose without conflict.
// - Spark: the latest matching event at or before t, flat over its width, fading over decayMs.
//   Hold: while a lasting event is held (no `untilMs` = still held).
// - Mirror: the other channel's finished frame (before the cap) fitted to this range. "stretch"
//   averages the light of the source pixels each target pixel covers (7 pixels onto 1 = the mean
//   light of all 7); "crop" takes source pixel j for target pixel j, base-aligned, and leaves
//   target pixels past the source's end untouched. A mirror cycle, or a mirror of a channel that
//   is not in the rig, contributes black.
// - Numbers outside the schema (NaN, zero periods) never throw and never reach the output as NaN.
import type { Channel, Config, Layer, Look } from "~/lib/config/schema";
import { encodeToByteFloat } from "./color";
import { compositeSpan, createPlanes, type Planes } from "./composite";
import { applyWipe, paintHold, paintSpark, type EventEnv } from "./events";
import { clamp01, finiteOr, paintBreathe, paintDrift, paintFill, paintGradient, paintShimmer } from "./paint";
import { seedInt } from "./random";
import { bladeStateAt, type Timeline } from "./timeline";

export interface RenderContext {
  /** The rig's channels (lengths, roles, mirror targets). */
  channels: readonly Channel[];
  /** Looks by channel id; a channel without one renders black. */
  looks: Readonly<Record<string, Look | undefined>>;
  /** rig.power.brightnessCap; 1 when absent. */
  brightnessCap?: number;
}

export interface Renderer {
  /** One frame of a channel: the same array for that channel on every call, overwritten each time. */
  render(channelId: string, timeMs: number, timeline: Timeline, seed: number): Uint8ClampedArray;
}

interface ChannelState {
  channel: Channel;
  index: number;
  n: number;
  dst: Planes;
  src: Planes;
  alpha: Float32Array;
  out: Uint8ClampedArray;
  busy: boolean;
}

/** The looks of one preset with the rig they run on. */
export function renderContextFor(config: Config, presetId: string): RenderContext {
  const preset = config.presets.find((p) => p.id === presetId);
  return { channels: config.rig.channels, looks: preset?.looks ?? {}, brightnessCap: config.rig.power.brightnessCap };
}

export function createRenderer(ctx: RenderContext): Renderer {
  const states = new Map<string, ChannelState>();
  const env: EventEnv = { t: 0, seed: 0, stream: 0, timeline: [], state: { lit: false, sinceMs: NaN } };

  // The context is read once per channel: a renderer belongs to one rig and one preset's looks.
  // An editor that changes either makes a new renderer (cheap: a few small arrays).
  function stateFor(channelId: string): ChannelState | undefined {
    const cached = states.get(channelId);
    if (cached !== undefined) return cached;
    let index = -1;
    for (let i = 0; i < ctx.channels.length; i++) if (ctx.channels[i].id === channelId) index = i;
    if (index < 0) return undefined;
    const channel = ctx.channels[index];
    const n = Math.max(1, Math.floor(finiteOr(channel.pixels, 1)));
    const s: ChannelState = { channel, index, n, dst: createPlanes(n), src: createPlanes(n), alpha: new Float32Array(n), out: new Uint8ClampedArray(n * 3), busy: false };
    states.set(channelId, s);
    return s;
  }

  function retractionRunMs(look: Look): number {
    let run = 0;
    for (let i = 0; i < look.layers.length; i++) {
      const l = look.layers[i];
      if (l.kind === "wipe" && l.enabled && l.event === "retraction" && l.durationMs > run) run = l.durationMs;
    }
    return Number.isFinite(run) ? run : 0;
  }

  /** Renders a channel's linear planes into s.dst; false when the channel is already being rendered (a mirror cycle). */
  function renderLinear(s: ChannelState): boolean {
    if (s.busy) return false;
    const { dst, src, alpha, n } = s;
    dst.r.fill(0);
    dst.g.fill(0);
    dst.b.fill(0);
    const look = ctx.looks[s.channel.id];
    if (look === undefined) return true;
    let whenLit = env.state.lit;
    if (s.channel.role === "main-blade" && !whenLit) {
      const since = env.state.sinceMs;
      if (Number.isNaN(since) || !(env.t - since < retractionRunMs(look))) return true;
      whenLit = true;
    }
    s.busy = true;
    const layers = look.layers;
    for (let li = 0; li < layers.length; li++) {
      const layer = layers[li];
      if (!layer.enabled) continue;
      if (layer.when === "lit" ? !whenLit : layer.when === "unlit" ? whenLit : false) continue;
      const from = Math.max(0, Math.floor(finiteOr(layer.range?.start ?? 0, 0)));
      const to = Math.min(n, Math.floor(finiteOr(layer.range?.end ?? n, n)));
      if (!(from < to)) continue;
      const opacity = clamp01(layer.opacity);
      if (opacity === 0) continue;
      env.stream = (s.index << 16) ^ li;
      if (layer.kind === "wipe") {
        applyWipe(layer, dst, from, to, opacity, env);
        continue;
      }
      if (paintLayer(layer, s, from, to, opacity)) compositeSpan(dst, src, alpha, layer.blend, from, to);
    }
    s.busy = false;
    return true;
  }

  function paintLayer(layer: Layer, s: ChannelState, from: number, to: number, opacity: number): boolean {
    const { src, alpha } = s;
    switch (layer.kind) {
      case "fill":
        return paintFill(layer, src, alpha, from, to, opacity);
      case "gradient":
        return paintGradient(layer, src, alpha, from, to, opacity);
      case "drift":
        return paintDrift(layer, src, alpha, from, to, opacity, env);
      case "breathe":
        return paintBreathe(layer, src, alpha, from, to, opacity, env);
      case "shimmer":
        return paintShimmer(layer, src, alpha, from, to, opacity, env);
      case "spark":
        return paintSpark(layer, src, alpha, from, to, opacity, env);
      case "hold":
        return paintHold(layer, src, alpha, from, to, opacity, env);
      case "mirror":
        return paintMirror(layer.channelId, layer.fit, s, from, to, opacity);
      default:
        return false;
    }
  }

  function paintMirror(channelId: string, fit: "stretch" | "crop", s: ChannelState, from: number, to: number, opacity: number): boolean {
    const { src, alpha } = s;
    const source = stateFor(channelId);
    // The stream is per layer; the source's own layers overwrite it, so keep ours.
    const stream = env.stream;
    const ok = source !== undefined && renderLinear(source);
    env.stream = stream;
    if (!ok) {
      src.r.fill(0, from, to);
      src.g.fill(0, from, to);
      src.b.fill(0, from, to);
      alpha.fill(opacity, from, to);
      return true;
    }
    const m = source.n;
    const sp = source.dst;
    const n = to - from;
    for (let i = from; i < to; i++) {
      const j = i - from;
      if (fit === "crop") {
        if (j < m) {
          src.r[i] = sp.r[j];
          src.g[i] = sp.g[j];
          src.b[i] = sp.b[j];
          alpha[i] = opacity;
        } else alpha[i] = 0;
        continue;
      }
      // Box filter over [a, b) in source pixels: every source pixel's light lands somewhere.
      const a = (j * m) / n;
      const b = ((j + 1) * m) / n;
      let r = 0, g = 0, bl = 0;
      for (let k = Math.floor(a); k < b && k < m; k++) {
        const w = Math.min(b, k + 1) - Math.max(a, k);
        r += sp.r[k] * w;
        g += sp.g[k] * w;
        bl += sp.b[k] * w;
      }
      const span = b - a;
      src.r[i] = r / span;
      src.g[i] = g / span;
      src.b[i] = bl / span;
      alpha[i] = opacity;
    }
    return true;
  }

  const black = new Uint8ClampedArray(0);

  return {
    render(channelId, timeMs, timeline, seed) {
      const s = stateFor(channelId);
      if (s === undefined) return black;
      env.t = finiteOr(timeMs, 0);
      env.seed = seedInt(seed);
      env.timeline = timeline;
      bladeStateAt(timeline, env.t, env.state);
      renderLinear(s);
      const cap = clamp01(finiteOr(ctx.brightnessCap ?? 1, 1));
      const { dst, out, n } = s;
      for (let i = 0, o = 0; i < n; i++, o += 3) {
        out[o] = encodeToByteFloat(dst.r[i]) * cap;
        out[o + 1] = encodeToByteFloat(dst.g[i]) * cap;
        out[o + 2] = encodeToByteFloat(dst.b[i]) * cap;
      }
      return out;
    },
  };
}

/**
 * One frame of `look` on `channel`, for one-off use (tests, a single swatch): it builds a renderer
 * each call. Loops over frames should hold a `createRenderer` instead, which allocates nothing per
 * frame. `ctx` supplies the other channels and looks that a mirror layer reads, and the cap.
 */
export function renderFrame(look: Look, channel: Channel, timeMs: number, timeline: Timeline, seed: number, ctx?: RenderContext): Uint8ClampedArray {
  const others = ctx?.channels.filter((c) => c.id !== channel.id) ?? [];
  const renderer = createRenderer({
    channels: [channel, ...others],
    looks: { ...(ctx?.looks ?? {}), [channel.id]: look },
    brightnessCap: ctx?.brightnessCap,
  });
  return renderer.render(channel.id, timeMs, timeline, seed);
}
