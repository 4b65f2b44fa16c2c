// The bundle's choices as a GET form (so the address names the bundle): revision, template,
// card names and the card's size. Shared by the Bundle page and the Check-a-card page.
import { Form } from "react-router";
import { CARD_SIZES } from "~/lib/bundle/query";
import type { BundlePage } from "~/lib/bundle/page.server";

export function BundleQueryForm({ page, submitLabel }: { page: Pick<BundlePage, "query" | "revisions" | "templates" | "pinnedLabel">; submitLabel: string }) {
  const q = page.query;
  const sizes = (CARD_SIZES as readonly number[]).includes(q.cardGb) ? CARD_SIZES : [...CARD_SIZES, q.cardGb].sort((a, b) => a - b);
  return (
    <Form method="get" className="card flex flex-wrap items-end gap-3">
      {page.revisions.length ? (
        <div>
          <label className="label" htmlFor="bundle-revision">
            Revision
          </label>
          <select id="bundle-revision" name="revision" className="field w-auto max-w-md" defaultValue={q.revision ?? ""}>
            <option value="">Today's config</option>
            {page.revisions.map((r) => (
              <option key={r.number} value={r.number}>
                {r.label}
              </option>
            ))}
          </select>
        </div>
      ) : null}
      <div>
        <label className="label" htmlFor="bundle-template">
          Template
        </label>
        <select id="bundle-template" name="template" className="field w-auto" defaultValue={q.template ?? ""}>
          <option value="">{q.revision === null ? `The build's own (${page.pinnedLabel})` : "The revision's own"}</option>
          {page.templates.map((t) => (
            <option key={t.ref} value={t.ref}>
              {t.label}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="bundle-names">
          Names on the card
        </label>
        <select id="bundle-names" name="names" className="field w-auto" defaultValue={q.mode}>
          <option value="long">Long names (FAT32)</option>
          <option value="8.3">8.3 short names</option>
        </select>
      </div>
      <div>
        <label className="label" htmlFor="bundle-card">
          Card size
        </label>
        <select id="bundle-card" name="card" className="field w-auto" defaultValue={String(q.cardGb)}>
          {sizes.map((gb) => (
            <option key={gb} value={gb}>
              {gb} GB
            </option>
          ))}
        </select>
      </div>
      <button type="submit" className="btn">
        {submitLabel}
      </button>
    </Form>
  );
}
