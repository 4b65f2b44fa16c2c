// Turns the rig form's flat fields (`channels.0.pixels`) into a rig object for the schema.
// Numbers that are blank or not numbers become NaN so the schema names the field.
import type { Rig } from "../config/schema";

const num = (v: FormDataEntryValue | null) => (v === null || String(v).trim() === "" ? Number.NaN : Number(v));
const str = (v: FormDataEntryValue | null) => (v === null ? "" : String(v).trim());
const pins = (v: FormDataEntryValue | null) =>
  str(v)
    .split(/[\s,]+/)
    .filter(Boolean)
    .map(Number);

function rows(form: FormData, prefix: string): number[] {
  const seen = new Set<number>();
  for (const key of form.keys()) {
    const m = new RegExp(`^${prefix}\\.(\\d{1,2})\\.`).exec(key);
    if (m) seen.add(Number(m[1]));
  }
  return [...seen].sort((a, b) => a - b);
}

export function rigFromForm(form: FormData): Rig {
  const g = (k: string) => form.get(k);
  return {
    board: {
      profile: str(g("board.profile")),
      dataPins: pins(g("board.dataPins")),
      inputPins: pins(g("board.inputPins")),
      maxPixelsPerPin: num(g("board.maxPixelsPerPin")),
      idleMilliamps: num(g("board.idleMilliamps")),
    },
    channels: rows(form, "channels").map((i) => ({
      id: str(g(`channels.${i}.id`)),
      name: str(g(`channels.${i}.name`)),
      role: str(g(`channels.${i}.role`)) as Rig["channels"][number]["role"],
      pixels: num(g(`channels.${i}.pixels`)),
      parallelStrips: num(g(`channels.${i}.parallelStrips`)),
      pin: num(g(`channels.${i}.pin`)),
      colorOrder: str(g(`channels.${i}.colorOrder`)) as Rig["channels"][number]["colorOrder"],
    })),
    buttons: rows(form, "buttons").map((i) => ({
      id: str(g(`buttons.${i}.id`)),
      name: str(g(`buttons.${i}.name`)),
      kind: str(g(`buttons.${i}.kind`)) as Rig["buttons"][number]["kind"],
      pin: num(g(`buttons.${i}.pin`)),
    })),
    power: {
      cellCapacityMah: num(g("power.cellCapacityMah")),
      cellNominalVolts: num(g("power.cellNominalVolts")),
      cellMaxContinuousAmps: num(g("power.cellMaxContinuousAmps")),
      wireGaugeAwg: num(g("power.wireGaugeAwg")),
      wireLengthMm: num(g("power.wireLengthMm")),
      brightnessCap: num(g("power.brightnessCap")),
      ledMilliampsPerColor: num(g("power.ledMilliampsPerColor")),
      pixelIdleMilliamps: num(g("power.pixelIdleMilliamps")),
    },
    speaker: {
      impedanceOhms: num(g("speaker.impedanceOhms")),
      ratedPowerWatts: num(g("speaker.ratedPowerWatts")),
      amplifierEfficiency: num(g("speaker.amplifierEfficiency")),
    },
  };
}

/**
 * Validator errors as the rig form shows them: those under `rig` keyed by the form's field name
 * (`rig.channels[0].pin` → `channels.0.pin`), the rest (presets that lose their channel, say) apart.
 */
export function rigErrorsForForm(errors: readonly { path: string; message: string }[]): { fieldErrors: Record<string, string>; elsewhere: { path: string; message: string }[] } {
  const fieldErrors: Record<string, string> = {};
  const elsewhere: { path: string; message: string }[] = [];
  for (const d of errors) {
    if (!d.path.startsWith("rig.")) {
      elsewhere.push(d);
      continue;
    }
    const key = d.path.slice(4).replace(/\[(\d+)\]/g, ".$1");
    fieldErrors[key] ??= d.message;
  }
  return { fieldErrors, elsewhere };
}
