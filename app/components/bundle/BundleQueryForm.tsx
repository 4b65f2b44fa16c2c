// The bundle's choices as a GET form (so the address names the bundle): revision, template,
// card names and the card's size. Shared by the Bundle page and the Check-a-card page; the
// template, names and size fields (`CardChoiceFields`) also by the Release tab.
import { Form } from "react-router";
import { CARD_SIZES } from "~/lib/bundle/query";
import type { BundlePage } from "~/lib/bundle/page.server";

export function BundleQueryForm({ page, submitLabel }: { page: Pick<BundlePage, "query" | "revisions" | "templates" | "pinnedLabel">; submitLabel: string }) {
  const q = page.query;
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
      <CardChoiceFields idPrefix="bundle" templates={page.templates} template={q.template} ownLabel={q.revision === null ? `The build's own (${page.pinnedLabel})` : "The revision's own"} mode={q.mode} cardGb={q.cardGb} />
      <button type="submit" className="btn">
        {submitLabel}
      </button>
    </Form>
  );
}

/** The template, names and card-size fields of a bundle's choices (ids start with `idPrefix`). */
export function CardChoiceFields({ idPrefix, templates, template, ownLabel, mode, cardGb }: { idPrefix: string; templates: { ref: string; label: string }[]; template: string | null; ownLabel: string; mode: string; cardGb: number }) {
  const sizes = (CARD_SIZES as readonly number[]).includes(cardGb) ? CARD_SIZES : [...CARD_SIZES, cardGb].sort((a, b) => a - b);
  return (
    <>
      <div>
        <label className="label" htmlFor={`${idPrefix}-template`}>
          Template
        </label>
        <select id={`${idPrefix}-template`} name="template" className="field w-auto" defaultValue={template ?? ""}>
          <option value="">{ownLabel}</option>
          {templates.map((t) => (
            <option key={t.ref} value={t.ref}>
              {t.label}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor={`${idPrefix}-names`}>
          Names on the card
        </label>
        <select id={`${idPrefix}-names`} name="names" className="field w-auto" defaultValue={mode}>
          <option value="long">Long names (FAT32)</option>
          <option value="8.3">8.3 short names</option>
        </select>
      </div>
      <div>
        <label className="label" htmlFor={`${idPrefix}-card`}>
          Card size
        </label>
        <select id={`${idPrefix}-card`} name="card" className="field w-auto" defaultValue={String(cardGb)}>
          {sizes.map((gb) => (
            <option key={gb} value={gb}>
              {gb} GB
            </option>
          ))}
        </select>
      </div>
    </>
  );
}
