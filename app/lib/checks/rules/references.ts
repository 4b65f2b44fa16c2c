// Everything that names something else must name something that exists, exactly once.
import type { RuleCode } from "./codes";
import type { RuleContext } from "./context";
import { layerPath, lookPath } from "./context";

function uniqueIds(ctx: RuleContext, items: readonly { id: string }[], base: string, what: string, code: RuleCode): void {
  const seen = new Map<string, number>();
  items.forEach((item, i) => {
    const first = seen.get(item.id);
    if (first === undefined) seen.set(item.id, i);
    else ctx.sink.error(code, `${base}[${i}].id`, `${what} id "${item.id}" is used twice (also ${base}[${first}]).`, `Give each ${what.toLowerCase()} its own id.`);
  });
}

export function referenceRules(ctx: RuleContext): void {
  const { config, sink } = ctx;
  uniqueIds(ctx, config.rig.channels, "rig.channels", "Channel", "duplicate-channel-id");
  uniqueIds(ctx, config.rig.buttons, "rig.buttons", "Button", "duplicate-button-id");
  uniqueIds(ctx, config.fonts, "fonts", "Font", "duplicate-font-id");
  uniqueIds(ctx, config.presets, "presets", "Preset", "duplicate-preset-id");

  // The card's file system matches names without regard to case.
  const folders = new Map<string, number>();
  config.fonts.forEach((f, i) => {
    const key = f.folder.toLowerCase();
    const first = folders.get(key);
    if (first === undefined) folders.set(key, i);
    else sink.error("duplicate-font-folder", `fonts[${i}].folder`, `Font "${f.name}" uses folder "${f.folder}", which fonts[${first}] already uses.`, "Give each font its own folder on the SD card (case does not count).");
  });

  const names = new Map<string, number>();
  config.presets.forEach((p, pi) => {
    const key = p.name.trim().toLowerCase();
    const first = names.get(key);
    if (first === undefined) names.set(key, pi);
    else sink.warning("duplicate-preset-name", `presets[${pi}].name`, `Preset name "${p.name}" is also used by presets[${first}].`, "Rename one so the client can tell them apart.");

    if (!ctx.fonts.has(p.fontId))
      sink.error("unknown-font", `presets[${pi}].fontId`, `Preset "${p.name}" uses font "${p.fontId}", which is not in the font list.`, "Add the font to the build or pick one of its fonts.");

    const edges = new Map<string, { target: string; path: string }[]>();
    for (const [channelId, look] of Object.entries(p.looks)) {
      // Layer ids are what diffs and merges follow; two alike in one look would be one layer to them.
      const layerIds = new Map<string, number>();
      look.layers.forEach((layer, li) => {
        const first = layerIds.get(layer.id);
        if (first === undefined) layerIds.set(layer.id, li);
        else sink.error("duplicate-layer-id", `${layerPath(pi, channelId, li)}.id`, `Layer id "${layer.id}" is used twice in the ${channelId} look of preset "${p.name}" (also layer ${first + 1}).`, "Give each layer of a look its own id (the look editor makes one for every layer it adds).");
      });
      if (!ctx.channels.has(channelId)) {
        sink.error("unknown-look-channel", lookPath(pi, channelId), `Preset "${p.name}" has a look for "${channelId}", which is not a channel of the rig.`, "Rename the look to a channel id or remove it.");
        continue;
      }
      look.layers.forEach((layer, li) => {
        if (layer.kind !== "mirror") return;
        const path = `${layerPath(pi, channelId, li)}.channelId`;
        if (layer.channelId === channelId) {
          sink.error("mirror-self", path, `The ${channelId} look mirrors itself.`, "Mirror a different channel, or remove the layer.");
        } else if (!ctx.channels.has(layer.channelId)) {
          sink.error("unknown-mirror-channel", path, `The ${channelId} look mirrors "${layer.channelId}", which is not a channel of the rig.`, "Pick an existing channel to mirror.");
        } else if (layer.enabled) {
          const list = edges.get(channelId) ?? [];
          list.push({ target: layer.channelId, path });
          edges.set(channelId, list);
        }
      });
    }
    mirrorCycles(ctx, p.name, edges);
  });

  config.controls.forEach((c, ci) => {
    if (c.trigger.input === "button" && !ctx.buttons.has(c.trigger.buttonId))
      sink.error("unknown-button", `controls[${ci}].trigger.buttonId`, `The ${c.event} control uses button "${c.trigger.buttonId}", which the rig does not have.`, "Pick one of the rig's buttons or add the button to the rig.");
  });
}

/** Depth-first search over "mirrors" edges; each cycle is reported once, at its first edge. */
function mirrorCycles(ctx: RuleContext, presetName: string, edges: Map<string, { target: string; path: string }[]>): void {
  if (edges.size < 2) return;
  const state = new Map<string, "open" | "done">();
  const stack: { node: string; path: string }[] = [];
  const visit = (node: string): void => {
    state.set(node, "open");
    for (const e of edges.get(node) ?? []) {
      const s = state.get(e.target);
      if (s === "open") {
        const at = stack.findIndex((f) => f.node === e.target);
        const ring = [...stack.slice(Math.max(0, at)).map((f) => f.node), node, e.target];
        const first = at >= 0 ? stack[at].path : e.path;
        ctx.sink.error("mirror-cycle", first, `In preset "${presetName}", mirrors go round in a circle: ${ring.join(" → ")}.`, "Break the circle: let one of these channels show its own layers instead of a mirror.");
      } else if (s === undefined) {
        stack.push({ node, path: e.path });
        visit(e.target);
        stack.pop();
      }
    }
    state.set(node, "done");
  };
  for (const node of edges.keys()) if (!state.has(node)) visit(node);
}
