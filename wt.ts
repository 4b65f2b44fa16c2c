import { wiringGraph } from "./app/lib/wiring/graph";
import { layoutWiring } from "./app/lib/wiring/layout";
import { validateConfig } from "./app/lib/checks/validate";
import { demoConfig } from "./app/lib/config/demo";
const { config, power, diagnostics } = validateConfig(demoConfig());
const g = wiringGraph(config!, power!, diagnostics);
for (let i = 0; i < 6; i++) { const t = performance.now(); await layoutWiring(g); console.log("layout", (performance.now() - t).toFixed(0)); }
