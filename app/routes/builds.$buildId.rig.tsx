import { useState } from "react";
import { data, Form, useActionData, useNavigation } from "react-router";
import { Field, Select } from "~/components/Field";
import { MessageField } from "~/components/revisions/MessageField";
import { requireViewer } from "~/lib/auth/auth.server";
import { readMessage } from "~/lib/forms/revision-message";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { fieldErrors } from "~/lib/forms/form-errors";
import { CHANNEL_ROLES, COLOR_ORDERS, rigSchema, type Rig } from "~/lib/config/schema";
import { can } from "~/lib/auth/permissions";
import { saveRig } from "~/lib/builds/builds.server";
import { rigFromForm } from "~/lib/forms/rig-form";
import { int4From } from "~/lib/input/edges";
import { WiringPicture } from "~/components/rig/WiringPicture";
import type { Route } from "./+types/builds.$buildId.rig";

export const meta: Route.MetaFunction = () => [{ title: "Rig · Hiltbench" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  const title = `Wiring of ${b.name}`;
  // The wiring picture is drawn in the browser (a worker): its layout takes too long to hold up the page.
  return { rig: b.config.rig, config: b.config, buildId: b.id, title, version: b.config_version, canEdit: can(v.role, "edit:build") };
}

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "edit:build");
  const b = await loadBuildFor(v, params.buildId);
  const form = await request.formData();
  const parsed = rigSchema.safeParse(rigFromForm(form));
  if (!parsed.success) return data({ ok: false as const, errors: fieldErrors(parsed.error), message: "Some fields need fixing; nothing was saved." }, { status: 400 });
  const note = readMessage(form.get("message"));
  if (!note.ok) return data({ ok: false as const, errors: { message: note.error } as Record<string, string>, message: note.error }, { status: 400 });
  const expected = int4From(form.get("version"));
  if (expected === null) return data({ ok: false as const, errors: {}, message: "The form must carry the config version the page was read at; reload the page. Nothing was saved." }, { status: 400 });
  const saved = await saveRig(v, b, parsed.data, expected, note.message);
  if (saved.kind === "invalid") return data({ ok: false as const, errors: saved.fieldErrors, message: saved.message }, { status: 422 });
  if (saved.kind === "stale")
    return data(
      { ok: false as const, errors: {}, message: "Someone saved this build since you opened it. Reload to see their change; nothing was saved." },
      { status: 409 },
    );
  return { ok: true as const, errors: {} as Record<string, string>, message: `Rig saved as revision ${saved.version}.` };
}

type RowKey = { key: number };

export default function RigPage({ loaderData }: Route.ComponentProps) {
  const { rig, config, buildId, title, version, canEdit } = loaderData;
  const result = useActionData<typeof action>();
  const nav = useNavigation();
  const e: Record<string, string> = result?.errors ?? {};
  return (
    <>
    <Form method="post" id="rig-form" className="space-y-6" key={version}>
      <input type="hidden" name="version" value={version} />
      {result?.message ? (
        <p role={result.ok ? "status" : "alert"} className={result.ok ? "text-signal-ok" : "text-signal-error"}>
          {result.message}
        </p>
      ) : null}
      <section className="card">
        <h2>Board</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-3">
          <Field name="board.profile" label="Board profile" defaultValue={rig.board.profile} error={e["board.profile"]} readOnly={!canEdit} className="sm:col-span-3" />
          <Field name="board.dataPins" label="LED data pins" defaultValue={rig.board.dataPins.join(", ")} error={e["board.dataPins"] ?? firstUnder(e, "board.dataPins.")} readOnly={!canEdit} />
          <Field name="board.inputPins" label="Button pins" defaultValue={rig.board.inputPins.join(", ")} error={e["board.inputPins"] ?? firstUnder(e, "board.inputPins.")} readOnly={!canEdit} />
          <Field name="board.maxPixelsPerPin" label="Max pixels per pin" type="number" defaultValue={rig.board.maxPixelsPerPin} error={e["board.maxPixelsPerPin"]} readOnly={!canEdit} />
          <Field name="board.idleMilliamps" label="Board idle current" unit="mA" type="number" defaultValue={rig.board.idleMilliamps} error={e["board.idleMilliamps"]} readOnly={!canEdit} />
        </div>
      </section>
      <ChannelRows rig={rig} errors={e} canEdit={canEdit} />
      <ButtonRows rig={rig} errors={e} canEdit={canEdit} />
      <section className="card">
        <h2>Cell and wiring</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-4">
          <Field name="power.cellCapacityMah" label="Cell capacity" unit="mAh" type="number" defaultValue={rig.power.cellCapacityMah} error={e["power.cellCapacityMah"]} readOnly={!canEdit} />
          <Field name="power.cellNominalVolts" label="Nominal voltage" unit="V" type="number" defaultValue={rig.power.cellNominalVolts} error={e["power.cellNominalVolts"]} readOnly={!canEdit} />
          <Field name="power.cellMaxContinuousAmps" label="Max continuous discharge" unit="A" type="number" defaultValue={rig.power.cellMaxContinuousAmps} error={e["power.cellMaxContinuousAmps"]} readOnly={!canEdit} />
          <Field name="power.brightnessCap" label="Brightness cap" unit="0–1" type="number" defaultValue={rig.power.brightnessCap} error={e["power.brightnessCap"]} readOnly={!canEdit} />
          <Field name="power.wireGaugeAwg" label="Wire gauge" unit="AWG" type="number" defaultValue={rig.power.wireGaugeAwg} error={e["power.wireGaugeAwg"]} readOnly={!canEdit} />
          <Field name="power.wireLengthMm" label="Wire length, cell to blade" unit="mm, one way" type="number" defaultValue={rig.power.wireLengthMm} error={e["power.wireLengthMm"]} readOnly={!canEdit} />
          <Field name="power.ledMilliampsPerColor" label="LED current per colour" unit="mA" type="number" defaultValue={rig.power.ledMilliampsPerColor} error={e["power.ledMilliampsPerColor"]} readOnly={!canEdit} />
          <Field name="power.pixelIdleMilliamps" label="Pixel idle current" unit="mA" type="number" defaultValue={rig.power.pixelIdleMilliamps} error={e["power.pixelIdleMilliamps"]} readOnly={!canEdit} />
        </div>
        <p className="mt-3 text-xs text-iron-400">
          Take the cell's capacity and continuous rating from the cell maker's data sheet, not from the label on a wrap. 20 mA per colour is
          a common-practice figure for 5050-type pixels; measure yours if you can.
        </p>
      </section>
      <section className="card">
        <h2>Speaker</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-3">
          <Field name="speaker.impedanceOhms" label="Impedance" unit="Ω" type="number" defaultValue={rig.speaker.impedanceOhms} error={e["speaker.impedanceOhms"]} readOnly={!canEdit} />
          <Field name="speaker.ratedPowerWatts" label="Rated power" unit="W" type="number" defaultValue={rig.speaker.ratedPowerWatts} error={e["speaker.ratedPowerWatts"]} readOnly={!canEdit} />
          <Field name="speaker.amplifierEfficiency" label="Amplifier efficiency" unit="0–1, assumed" type="number" defaultValue={rig.speaker.amplifierEfficiency} error={e["speaker.amplifierEfficiency"]} readOnly={!canEdit} />
        </div>
      </section>
      {canEdit ? (
        <div className="flex flex-wrap items-end gap-3">
          <MessageField id="rig-message" className="min-w-64 flex-1" />
          <button type="submit" className="btn btn-primary" disabled={nav.state !== "idle"}>
            Save rig
          </button>
        </div>
      ) : null}
    </Form>
    <WiringPicture config={config} buildId={buildId} title={title} formId="rig-form" />
    </>
  );
}

function firstUnder(errors: Record<string, string>, prefix: string) {
  const k = Object.keys(errors).find((x) => x.startsWith(prefix));
  return k ? errors[k] : undefined;
}

function useRows(count: number) {
  const [rows, setRows] = useState<RowKey[]>(() => Array.from({ length: count }, (_, i) => ({ key: i })));
  const add = () => setRows((r) => [...r, { key: Math.max(-1, ...r.map((x) => x.key)) + 1 }]);
  const remove = (key: number) => setRows((r) => r.filter((x) => x.key !== key));
  return { rows, add, remove };
}

function ChannelRows({ rig, errors, canEdit }: { rig: Rig; errors: Record<string, string>; canEdit: boolean }) {
  const { rows, add, remove } = useRows(rig.channels.length);
  return (
    <section className="card">
      <h2>Channels</h2>
      <div className="mt-3 space-y-3">
        {rows.map(({ key }) => {
          const c = rig.channels[key];
          const p = `channels.${key}`;
          return (
            <fieldset key={key} className="grid items-end gap-3 rounded-md border border-soot-700 p-3 sm:grid-cols-8" aria-label={`Channel ${key + 1}`}>
              <Field name={`${p}.id`} label="Id" defaultValue={c?.id ?? ""} error={errors[`${p}.id`]} readOnly={!canEdit} />
              <Field name={`${p}.name`} label="Name" defaultValue={c?.name ?? ""} error={errors[`${p}.name`]} readOnly={!canEdit} className="sm:col-span-2" />
              <Select name={`${p}.role`} label="Role" options={CHANNEL_ROLES} defaultValue={c?.role ?? "custom"} error={errors[`${p}.role`]} readOnly={!canEdit} />
              <Field name={`${p}.pixels`} label="Pixels" unit="per strip" type="number" defaultValue={c?.pixels ?? 1} error={errors[`${p}.pixels`]} readOnly={!canEdit} />
              <Field name={`${p}.parallelStrips`} label="Strips" unit="parallel" type="number" defaultValue={c?.parallelStrips ?? 1} error={errors[`${p}.parallelStrips`]} readOnly={!canEdit} />
              <Field name={`${p}.pin`} label="Data pin" type="number" defaultValue={c?.pin ?? ""} error={errors[`${p}.pin`]} readOnly={!canEdit} />
              <div className="flex items-end gap-2">
                <Select name={`${p}.colorOrder`} label="Colour order" options={COLOR_ORDERS} defaultValue={c?.colorOrder ?? "GRB"} readOnly={!canEdit} />
                {canEdit ? (
                  <button type="button" className="btn btn-danger" onClick={() => remove(key)} aria-label={`Remove channel ${c?.name ?? key + 1}`}>
                    ✕
                  </button>
                ) : null}
              </div>
            </fieldset>
          );
        })}
      </div>
      {errors.channels ? <p className="field-error">Channels {errors.channels}</p> : null}
      {canEdit ? (
        <button type="button" className="btn mt-3" onClick={add}>
          Add channel
        </button>
      ) : null}
    </section>
  );
}

function ButtonRows({ rig, errors, canEdit }: { rig: Rig; errors: Record<string, string>; canEdit: boolean }) {
  const { rows, add, remove } = useRows(rig.buttons.length);
  return (
    <section className="card">
      <h2>Buttons</h2>
      <div className="mt-3 space-y-3">
        {rows.map(({ key }) => {
          const b = rig.buttons[key];
          const p = `buttons.${key}`;
          return (
            <fieldset key={key} className="grid items-end gap-3 rounded-md border border-soot-700 p-3 sm:grid-cols-5" aria-label={`Button ${key + 1}`}>
              <Field name={`${p}.id`} label="Id" defaultValue={b?.id ?? ""} error={errors[`${p}.id`]} readOnly={!canEdit} />
              <Field name={`${p}.name`} label="Name" defaultValue={b?.name ?? ""} error={errors[`${p}.name`]} readOnly={!canEdit} className="sm:col-span-2" />
              <Select name={`${p}.kind`} label="Kind" options={["activation", "auxiliary"]} defaultValue={b?.kind ?? "auxiliary"} readOnly={!canEdit} />
              <div className="flex items-end gap-2">
                <Field name={`${p}.pin`} label="Pin" type="number" defaultValue={b?.pin ?? ""} error={errors[`${p}.pin`]} readOnly={!canEdit} />
                {canEdit ? (
                  <button type="button" className="btn btn-danger" onClick={() => remove(key)} aria-label={`Remove button ${b?.name ?? key + 1}`}>
                    ✕
                  </button>
                ) : null}
              </div>
            </fieldset>
          );
        })}
      </div>
      {canEdit ? (
        <button type="button" className="btn mt-3" onClick={add}>
          Add button
        </button>
      ) : null}
    </section>
  );
}
