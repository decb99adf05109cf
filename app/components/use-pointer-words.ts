import { useSyncExternalStore } from "react";

const COARSE = "(pointer: coarse)";

function subscribe(changed: () => void) {
  const query = window.matchMedia?.(COARSE);
  query?.addEventListener("change", changed);
  return () => query?.removeEventListener("change", changed);
}

const isCoarse = () => window.matchMedia?.(COARSE).matches ?? false;

/** The words a hint uses for pressing on the screen: a finger taps, a mouse clicks. */
export interface PointerWords {
  coarse: boolean;
  click: "click" | "tap";
  Click: "Click" | "Tap";
  doubleClick: "double-click" | "double-tap";
  clicking: "clicking" | "tapping";
}

const MOUSE: PointerWords = {
  coarse: false,
  click: "click",
  Click: "Click",
  doubleClick: "double-click",
  clicking: "clicking",
};
const TOUCH: PointerWords = {
  coarse: true,
  click: "tap",
  Click: "Tap",
  doubleClick: "double-tap",
  clicking: "tapping",
};

/**
 * "tap" where the main pointer is coarse (a touch screen), "click" otherwise. The server cannot
 * know, so it and the hydrating render say "click" (the server's snapshot) and the browser's
 * answer follows straight after mount: no hydration mismatch. Follows a change of pointer too
 * (a tablet docked to a keyboard and trackpad).
 */
export function usePointerWords(): PointerWords {
  return useSyncExternalStore(subscribe, isCoarse, () => false) ? TOUCH : MOUSE;
}
