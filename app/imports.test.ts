// The house stays without import cycles: no file under app/ reaches itself through its imports,
// and no concern folder (app/lib/<area>, app/components/<area>, app/routes, …) reaches itself
// through another (tests excepted at folder level: nothing imports a test). Type-only imports count too: a cycle of types is still two concerns that
// cannot be read or moved apart. The graph is read with the TypeScript compiler's own module
// resolution (tsconfig paths, `~/`), so it sees what `tsc` sees (decision 009).
import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import ts from "typescript";
import { describe, expect, it } from "vitest";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const appDir = path.join(root, "app");

function compilerOptions(): ts.CompilerOptions {
  const file = path.join(root, "tsconfig.json");
  const read = ts.readConfigFile(file, ts.sys.readFile);
  return ts.parseJsonConfigFileContent(read.config, ts.sys, root).options;
}

/** Every .ts/.tsx source under app/ (tests included: a test that closes a cycle is still one). */
function sources(): string[] {
  return ts.sys.readDirectory(appDir, [".ts", ".tsx"], undefined, undefined).map((f) => path.resolve(f));
}

/** file → the app files it imports (static, type-only, re-exports and dynamic `import()`). */
export function importGraph(): Map<string, Set<string>> {
  const options = compilerOptions();
  const files = sources();
  const inApp = new Set(files);
  const graph = new Map<string, Set<string>>();
  for (const file of files) {
    const info = ts.preProcessFile(readFileSync(file, "utf8"), true, true);
    const out = new Set<string>();
    for (const ref of info.importedFiles) {
      const r = ts.resolveModuleName(ref.fileName, file, options, ts.sys).resolvedModule;
      if (!r) continue;
      const target = path.resolve(r.resolvedFileName);
      if (inApp.has(target) && target !== file) out.add(target);
    }
    graph.set(file, out);
  }
  return graph;
}

/** Strongly connected components with more than one member (Tarjan), each sorted. */
export function cycles<T>(graph: Map<T, Set<T>>): T[][] {
  let index = 0;
  const idx = new Map<T, number>();
  const low = new Map<T, number>();
  const stack: T[] = [];
  const on = new Set<T>();
  const found: T[][] = [];
  const visit = (v: T) => {
    idx.set(v, index);
    low.set(v, index);
    index++;
    stack.push(v);
    on.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!idx.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (on.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
    }
    if (low.get(v) === idx.get(v)) {
      const scc: T[] = [];
      let w: T;
      do {
        w = stack.pop()!;
        on.delete(w);
        scc.push(w);
      } while (w !== v);
      if (scc.length > 1) found.push(scc.sort());
    }
  };
  for (const v of graph.keys()) if (!idx.has(v)) visit(v);
  return found;
}

/** The concern a file belongs to: `lib/checks` for app/lib/checks/rules/power.ts, `routes` for a route. */
export function concernOf(file: string): string {
  const parts = path.relative(appDir, file).split(path.sep);
  if (parts.length === 1) return parts[0].replace(/\.(ts|tsx)$/, "");
  if (parts[0] === "lib" || parts[0] === "components") return parts.length === 2 ? parts[0] : `${parts[0]}/${parts[1]}`;
  return parts[0];
}

const rel = (f: string) => path.relative(root, f);

describe("import cycles under app/", () => {
  const graph = importGraph();

  it("reads a real graph (the check would pass vacuously otherwise)", () => {
    expect(graph.size).toBeGreaterThan(100);
    const validate = path.join(appDir, "lib/checks/validate.ts");
    expect([...(graph.get(validate) ?? [])].map(rel)).toContain("app/lib/checks/diagnostics.ts");
    // `~/` imports and type-only imports are edges too.
    const route = path.join(appDir, "routes/builds.$buildId.checks.tsx");
    expect([...(graph.get(route) ?? [])].map(rel)).toContain("app/lib/auth/auth.server.ts");
  });

  it("finds a cycle when there is one", () => {
    const g = new Map([
      ["a", new Set(["b"])],
      ["b", new Set(["c"])],
      ["c", new Set(["a"])],
      ["d", new Set(["a"])],
    ]);
    expect(cycles(g)).toEqual([["a", "b", "c"]]);
    expect(concernOf(path.join(appDir, "lib/checks/rules/power.ts"))).toBe("lib/checks");
    expect(concernOf(path.join(appDir, "lib/env.server.ts"))).toBe("lib");
    expect(concernOf(path.join(appDir, "routes/home.tsx"))).toBe("routes");
  });

  it("has no cycle between files", () => {
    expect(cycles(graph).map((c) => c.map(rel))).toEqual([]);
  });

  it("keeps routes off the database handle: they call the domain, which goes through repo/", () => {
    const handle = path.join(appDir, "lib/db/db.server.ts");
    const routes = [...graph].filter(([from, tos]) => concernOf(from) === "routes" && tos.has(handle)).map(([from]) => rel(from));
    // The health check asks the database to answer and nothing else.
    expect(routes).toEqual(["app/routes/healthz.ts"]);
  });

  it("has no cycle between concern folders", () => {
    const folders = new Map<string, Set<string>>();
    const why = new Map<string, string>();
    for (const [from, tos] of graph) {
      // A test may reach across (a rule's test builds configs with the demo); nothing imports it back.
      if (/\.test\.tsx?$/.test(from)) continue;
      const a = concernOf(from);
      if (!folders.has(a)) folders.set(a, new Set());
      for (const to of tos) {
        const b = concernOf(to);
        if (a === b) continue;
        folders.get(a)!.add(b);
        why.set(`${a} → ${b}`, `${rel(from)} imports ${rel(to)}`);
      }
    }
    const found = cycles(folders);
    // Name one import per arrow inside each cycle, so the failure says where to cut.
    const explain = found.map((c) => [...why].filter(([k]) => c.includes(k.split(" → ")[0]) && c.includes(k.split(" → ")[1])).map(([, v]) => v));
    expect(explain).toEqual([]);
  });
});
