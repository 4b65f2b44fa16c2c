import { createElement as h } from "react";
import { renderToString } from "react-dom/server";
import { describe, expect, it } from "vitest";
import type { Diagnostic } from "~/lib/checks/diagnostics";
import { indexDiagnostics } from "~/lib/looks/diagnostic-index";
import { ColourInput, EditorContext, NumberInput } from "./controls";

// No DOM: these check the server-rendered markup of a control with checks around it.
const path = "presets[0].looks.chamber.layers[3].periodMs";
const warn: Diagnostic = { severity: "warning", code: "breathe-period-out-of-range", path, message: "A breathe period of 1 ms is outside the usual 500–20000 ms.", hint: "Raise it." };
const err: Diagnostic = { ...warn, severity: "error", code: "timing-not-positive", message: "A breathe period of 0 ms cannot run." };

function render(el: ReturnType<typeof h>, diagnostics: Diagnostic[], readOnly = false) {
  return renderToString(h(EditorContext.Provider, { value: { checks: indexDiagnostics(diagnostics), readOnly } }, el));
}

describe("controls with checks", () => {
  const number = (value: number) => h(NumberInput, { label: "Period", unit: "ms", value, path, min: 200, max: 10000, onChange: () => {} });

  it("shows the diagnostic for its own path, described by the field", () => {
    const html = render(number(1), [warn]);
    expect(html).toContain("A breathe period of 1 ms is outside");
    expect(html).toMatch(/aria-describedby="[^"]+"/);
    // A warning informs; only an error marks the value invalid.
    expect(html).not.toContain("aria-invalid");
    expect(render(number(0), [err])).toContain('aria-invalid="true"');
  });

  it("ignores diagnostics for other paths", () => {
    const html = render(number(1), [{ ...warn, path: "presets[0].looks.chamber.layers[2].periodMs" }]);
    expect(html).not.toContain("outside the usual");
    expect(html).not.toContain("aria-describedby");
  });

  it("labels the slider and the typed number with the unit", () => {
    const html = render(number(2400), []);
    expect(html).toMatch(/<input type="range" aria-label="Period slider"[^>]*value="2400"/);
    expect(html).toMatch(/>Period<span[^>]*> \(<!-- -->ms<!-- -->\)<\/span><\/label>/);
    expect(html).toMatch(/<input id="([^"]+)" type="text"[^>]*value="2400"/);
    const id = /<input id="([^"]+)" type="text"/.exec(html)![1];
    expect(html).toContain(`<label class="label" for="${id}">Period`);
  });

  it("is read-only for viewers who cannot edit", () => {
    const html = render(h(ColourInput, { label: "Colour", value: "#ff8800", path: "x", onChange: () => {} }), [], true);
    expect(html).toMatch(/type="color"[^>]*disabled=""[^>]*value="#ff8800"/);
    expect(html).toMatch(/type="text"[^>]*readOnly=""[^>]*value="#ff8800"/);
  });
});
