// The wiring picture of a rig: drawn from the model by ELK's layered layout, with the worst
// preset's currents on every lead and the validator's codes beside pins in conflict. Pure and
// deterministic: the same config gives the same SVG bytes, on the server and in the browser.
import { validateConfig } from "../checks/validate";
import { powerModeFor } from "../checks/power-mode";
import { describeWiring, wiringGraph, type WiringGraph } from "./graph";
import { layoutWiring } from "./layout";
import { refusalSvg, wiringSvg } from "./svg";

export type { WiringGraph } from "./graph";
export { describeWiring, wiringGraph } from "./graph";

export type WiringPicture =
  | { ok: true; svg: string; connections: string[]; graph: WiringGraph }
  | { ok: false; svg: string; reasons: string[] };

/** Draw a build's rig. `input` is a whole config as stored or as edited (it is validated here). */
export async function drawWiring(input: unknown, title = "Wiring picture"): Promise<WiringPicture> {
  const { config, diagnostics, power } = validateConfig(input, { power: powerModeFor(input) });
  if (!config || !power) {
    const reasons = diagnostics.filter((d) => d.severity === "error").map((d) => `${d.path || "config"}: ${d.message}`);
    return { ok: false, svg: refusalSvg(title, reasons), reasons };
  }
  const graph = wiringGraph(config, power, diagnostics);
  const connections = describeWiring(graph);
  const layout = await layoutWiring(graph);
  return { ok: true, svg: wiringSvg(graph, layout, title, connections.join(" ")), connections, graph };
}
