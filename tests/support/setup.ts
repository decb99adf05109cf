import { afterEach, beforeEach, vi } from "vitest";

// A console.error in a test is a failure: it means something went wrong that nobody asserted.
let errors: unknown[][] = [];
beforeEach(() => {
  errors = [];
  vi.spyOn(console, "error").mockImplementation((...args: unknown[]) => {
    errors.push(args);
  });
});
afterEach(() => {
  vi.restoreAllMocks();
  if (errors.length) {
    throw new Error(`console.error was called:\n${errors.map((a) => a.map(String).join(" ")).join("\n")}`);
  }
});
