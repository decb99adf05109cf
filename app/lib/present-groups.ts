/** The parts of the presenter's list (client-safe): the class's assigned lessons, the rest of the course, my roofs. */
export type DeckGroup = "assigned" | "course" | "roofs";

/** Group labels in list order; the presenter's select shows a divider (an option group) between them. */
export const DECK_GROUP_LABELS: Record<DeckGroup, string> = {
  assigned: "Assigned to this class",
  course: "Other lessons",
  roofs: "My saved roofs",
};
