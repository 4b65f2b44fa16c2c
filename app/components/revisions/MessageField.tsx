// The optional "what changed" line every config save form offers; it becomes the revision's message.
import { MESSAGE_MAX } from "~/lib/forms/revision-message";

export function MessageField({ id, className, value, onChange }: { id: string; className?: string; value?: string; onChange?: (v: string) => void }) {
  return (
    <div className={className}>
      <label className="label" htmlFor={id}>
        What changed <span className="normal-case text-iron-400">(optional, shown in the revisions)</span>
      </label>
      <input
        id={id}
        name="message"
        type="text"
        maxLength={MESSAGE_MAX}
        className="field w-full"
        placeholder="e.g. slower drift on the chamber strip"
        {...(onChange ? { value: value ?? "", onChange: (e) => onChange(e.target.value) } : {})}
      />
    </div>
  );
}
