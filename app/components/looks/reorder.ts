// Reordering a list by drag (HTML drag and drop) and by keyboard (Alt+↑ / Alt+↓ on an item).
// Each list names its own drag type, so a layer cannot be dropped into the preset list.
import type { DragEvent, KeyboardEvent } from "react";

export function dragProps(type: string, group: string, index: number, move: (from: number, to: number) => void, enabled: boolean) {
  const mime = `application/x-hiltbench-${type}`;
  if (!enabled) return {};
  return {
    draggable: true,
    onDragStart: (e: DragEvent) => {
      e.dataTransfer.setData(mime, `${group}|${index}`);
      e.dataTransfer.effectAllowed = "move";
    },
    onDragOver: (e: DragEvent) => {
      if (e.dataTransfer.types.includes(mime)) {
        e.preventDefault();
        e.dataTransfer.dropEffect = "move";
      }
    },
    onDrop: (e: DragEvent) => {
      const data = e.dataTransfer.getData(mime);
      const cut = data.lastIndexOf("|");
      if (cut < 0 || data.slice(0, cut) !== group) return;
      e.preventDefault();
      const from = Number(data.slice(cut + 1));
      if (Number.isInteger(from) && from !== index) move(from, index);
    },
  };
}

/** Alt+ArrowUp / Alt+ArrowDown move the item; true when the key was taken. */
export function reorderKey(e: KeyboardEvent, index: number, count: number, move: (from: number, to: number) => void): boolean {
  if (!e.altKey || (e.key !== "ArrowUp" && e.key !== "ArrowDown")) return false;
  const to = e.key === "ArrowUp" ? index - 1 : index + 1;
  e.preventDefault();
  if (to >= 0 && to < count) move(index, to);
  return true;
}
