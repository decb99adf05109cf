/**
 * The keyboard shortcuts, one list per screen that has them. The handlers live beside their
 * screens (plan editor, undo, present mode); this list is what people are told, on screen in the
 * shortcuts panel (`?`) and in the plan's description for screen readers, so both say the same.
 */
export interface Shortcut {
  /** Keys as pressed, each shown as its own key cap ("Shift", "Arrow keys"). */
  keys: string[];
  does: string;
}

export interface ShortcutGroup {
  title: string;
  items: Shortcut[];
}

export const PLAN_SHORTCUTS: ShortcutGroup = {
  title: "Plan",
  items: [
    { keys: ["Tab"], does: "moves between corners, edges and outlets" },
    { keys: ["Arrow keys"], does: "move a corner or slide an outlet by the grid step" },
    { keys: ["Shift", "Arrow keys"], does: "four grid steps at a time" },
    { keys: ["Alt", "Arrow keys"], does: "10 mm at a time" },
    { keys: ["Delete"], does: "removes the corner or outlet" },
    { keys: ["+"], does: "adds a corner half-way along the edge" },
    { keys: ["Enter"], does: "on an edge: places an outlet at its middle" },
    { keys: ["E"], does: "on an edge: switches parapet and eaves" },
    { keys: ["Arrow keys"], does: "on an opening: move it; on its corner: resize it; on a ridge point: move it" },
    { keys: ["Delete"], does: "on an opening: removes it; on a ridge's bend: removes the bend, on its end: the ridge" },
    { keys: ["+"], does: "on a ridge point: adds a bend half-way to the next point" },
    { keys: ["Enter"], does: "while drawing a ridge: ends it at the last point" },
    { keys: ["Esc"], does: "while drawing a ridge or an opening: drops the points so far, then stops drawing" },
  ],
};

export const UNDO_SHORTCUTS: ShortcutGroup = {
  title: "Editing",
  items: [
    { keys: ["Ctrl", "Z"], does: "undoes the last change (⌘ Z on a Mac)" },
    { keys: ["Ctrl", "Shift", "Z"], does: "redoes it (Ctrl Y too)" },
  ],
};

export const PRESENT_SHORTCUTS: ShortcutGroup = {
  title: "Presenting",
  items: [
    { keys: ["→"], does: "next roof (Page Down too)" },
    { keys: ["←"], does: "previous roof (Page Up too)" },
    { keys: ["Esc"], does: "closes the wall of handed-up roofs" },
  ],
};

export const HELP_SHORTCUT: Shortcut = { keys: ["?"], does: "shows this list" };

/** One group as a sentence, for a screen reader's description of the control it belongs to. */
export function shortcutSentence(group: ShortcutGroup): string {
  return group.items.map((s) => `${s.keys.join(" ")}: ${s.does}.`).join(" ");
}
