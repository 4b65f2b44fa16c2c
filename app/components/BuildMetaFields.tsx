import { STATUS_LABELS } from "~/lib/forms/build-forms";
import { BUILD_STATUSES } from "~/lib/db/types";

export function BuildMetaFields({
  clients,
  errors,
  values,
}: {
  clients: { id: string; display_name: string; email: string | null }[];
  errors?: Record<string, string>;
  values?: { name: string; client_name: string; client_user_id: string | null; hilt_notes: string; status: string };
}) {
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <div>
        <label className="label" htmlFor="name">
          Build name
        </label>
        <input id="name" name="name" className="field" defaultValue={values?.name} aria-invalid={!!errors?.name} />
        {errors?.name ? <p className="field-error">{errors.name}</p> : null}
      </div>
      <div>
        <label className="label" htmlFor="status">
          Status
        </label>
        <select id="status" name="status" className="field" defaultValue={values?.status ?? "intake"}>
          {BUILD_STATUSES.map((s) => (
            <option key={s} value={s}>
              {STATUS_LABELS[s]}
            </option>
          ))}
        </select>
        {errors?.status ? <p className="field-error">{errors.status}</p> : null}
      </div>
      <div>
        <label className="label" htmlFor="clientName">
          Client name
        </label>
        <input id="clientName" name="clientName" className="field" defaultValue={values?.client_name} />
        {errors?.clientName ? <p className="field-error">{errors.clientName}</p> : null}
      </div>
      <div>
        <label className="label" htmlFor="clientUserId">
          Client account (for the handoff sheet)
        </label>
        <select id="clientUserId" name="clientUserId" className="field" defaultValue={values?.client_user_id ?? ""}>
          <option value="">None</option>
          {clients.map((c) => (
            <option key={c.id} value={c.id}>
              {c.display_name} {c.email ? `(${c.email})` : ""}
            </option>
          ))}
        </select>
        {errors?.clientUserId ? <p className="field-error">{errors.clientUserId}</p> : null}
      </div>
      <div className="sm:col-span-2">
        <label className="label" htmlFor="hiltNotes">
          Hilt notes
        </label>
        <textarea id="hiltNotes" name="hiltNotes" rows={4} className="field" defaultValue={values?.hilt_notes} />
        {errors?.hiltNotes ? <p className="field-error">{errors.hiltNotes}</p> : null}
      </div>
    </div>
  );
}

