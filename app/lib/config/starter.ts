// What a new build starts from: the usual three-channel rig with two buttons and the usual
// controls, no fonts or presets yet (those arrive with the client's fonts).
import { demoConfig } from "./demo";
import type { Config } from "./schema";

export function starterConfig(): Config {
  const c = demoConfig();
  return { ...c, fonts: [], presets: [] };
}
