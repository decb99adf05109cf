import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { moveVertex } from "~/components/sandbox/state/spec-edit";
import { createSandboxStore } from "~/components/sandbox/state/store";
import { keepSpecInSession, SESSION_WRITE_DELAY_MS } from "~/components/sandbox/state/use-session-spec";

/** A tab's sessionStorage and its `pagehide`, without a browser. */
function fakeTab() {
  const items = new Map<string, string>();
  const page = new EventTarget();
  return {
    place: {
      storage: {
        getItem: (k: string) => items.get(k) ?? null,
        setItem: (k: string, v: string) => void items.set(k, v),
      },
      page,
    },
    kept: (k: string) => (items.has(k) ? JSON.parse(items.get(k)!) : null),
    hide: () => page.dispatchEvent(new Event("pagehide")),
  };
}

describe("the sandbox keeps an unsaved roof in the tab's sessionStorage", () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => vi.useRealTimers());

  it("writes once the roof has rested, not on every move of a drag", () => {
    const tab = fakeTab();
    const store = createSandboxStore(DEMO_ROOF);
    const stop = keepSpecInSession(store, "k", false, tab.place);
    store.getState().edit((s) => moveVertex(s, 2, [12, 9]));
    vi.advanceTimersByTime(SESSION_WRITE_DELAY_MS - 50);
    store.getState().edit((s) => moveVertex(s, 2, [12, 10]));
    vi.advanceTimersByTime(SESSION_WRITE_DELAY_MS - 50);
    expect(tab.kept("k")).toBeNull();
    vi.advanceTimersByTime(50);
    expect(tab.kept("k").outline[2]).toEqual([12, 10]);
    stop();
  });

  it("writes an edit made just before a reload or a closed tab at once, on pagehide", () => {
    const tab = fakeTab();
    const store = createSandboxStore(DEMO_ROOF);
    const stop = keepSpecInSession(store, "k", false, tab.place);
    store.getState().edit((s) => ({ ...s, baseFall: "1:48" }));
    tab.hide();
    expect(tab.kept("k").baseFall).toBe("1:48");
    stop();
  });

  it("writes it when the workspace goes away (a link to the check sheet), and nothing afterwards", () => {
    const tab = fakeTab();
    const store = createSandboxStore(DEMO_ROOF);
    const stop = keepSpecInSession(store, "k", false, tab.place);
    store.getState().edit((s) => moveVertex(s, 2, [12, 9]));
    stop();
    expect(tab.kept("k").outline[2]).toEqual([12, 9]);
    store.getState().edit((s) => moveVertex(s, 2, [12, 11]));
    vi.advanceTimersByTime(SESSION_WRITE_DELAY_MS * 2);
    tab.hide();
    expect(tab.kept("k").outline[2]).toEqual([12, 9]);
  });
});
