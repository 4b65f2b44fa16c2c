// A dashed area that takes dropped files (the font upload and Check a card): it lights up while
// something is dragged over it and hands the drop's DataTransfer to `onDrop`, unless `busy`.
// What it holds (the words, the pickers) comes from its children.
import { useState, type ReactNode } from "react";

export function DropZone({ busy, onDrop, testId, children }: { busy: boolean; onDrop: (data: DataTransfer) => void; testId: string; children: ReactNode }) {
  const [over, setOver] = useState(false);
  return (
    <div
      className={`rounded border-2 border-dashed p-4 text-sm ${over ? "border-ember-500 bg-soot-800" : "border-soot-600"}`}
      onDragOver={(e) => {
        e.preventDefault();
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={(e) => {
        e.preventDefault();
        setOver(false);
        if (!busy) onDrop(e.dataTransfer);
      }}
      data-testid={testId}
    >
      {children}
    </div>
  );
}
