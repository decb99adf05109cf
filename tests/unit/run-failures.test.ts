import { describe, expect, it } from "vitest";
import { playwrightFailures, vitestFailures } from "../support/failures";

// Shapes as vitest's "json" reporter and Playwright's "json" reporter write them (fields we read only).
describe("npm test names what failed beside its last line", () => {
  it("lists vitest's failed tests by file and full name, with the first line of the error", () => {
    const report = {
      testResults: [
        {
          name: "/repo/tests/integration/operations.test.ts",
          status: "failed",
          message: "",
          assertionResults: [
            {
              fullName: "heavy analyses a slow one does not hold up /healthz",
              status: "failed",
              failureMessages: [
                "\u001b[31mAssertionError: expected 1204 to be less than 1000\u001b[39m\n    at x.ts:1",
              ],
            },
            { fullName: "heavy analyses charges by work", status: "passed", failureMessages: [] },
          ],
        },
        {
          name: "/repo/tests/unit/a.test.ts",
          status: "passed",
          assertionResults: [{ fullName: "ok", status: "passed" }],
        },
      ],
    };
    expect(vitestFailures(report, "/repo")).toEqual([
      "vitest tests/integration/operations.test.ts › heavy analyses a slow one does not hold up /healthz (failed): AssertionError: expected 1204 to be less than 1000",
    ]);
  });

  it("names a vitest file that broke before any test ran, and a skipped test", () => {
    const report = {
      testResults: [
        {
          name: "/repo/tests/integration/b.test.ts",
          status: "failed",
          message: "Hook timed out in 60000ms",
          assertionResults: [],
        },
        {
          name: "/repo/tests/unit/c.test.ts",
          status: "passed",
          assertionResults: [{ fullName: "later", status: "skipped" }],
        },
      ],
    };
    expect(vitestFailures(report, "/repo")).toEqual([
      "vitest tests/integration/b.test.ts: Hook timed out in 60000ms",
      "vitest tests/unit/c.test.ts › later (skipped): ",
    ]);
  });

  it("walks Playwright's nested suites and lists unexpected tests with project, place and error", () => {
    const report = {
      suites: [
        {
          title: "classroom.spec.ts",
          specs: [],
          suites: [
            {
              title: "live",
              specs: [
                {
                  title: "a follower sees the move",
                  file: "classroom.spec.ts",
                  line: 102,
                  tests: [
                    {
                      projectName: "timed",
                      status: "unexpected",
                      results: [
                        {},
                        { error: { message: "Error: expect(received).toBeLessThan(expected)\n\nExpected: < 1000" } },
                      ],
                    },
                  ],
                },
                {
                  title: "fine",
                  file: "classroom.spec.ts",
                  line: 9,
                  tests: [{ projectName: "timed", status: "flaky", results: [] }],
                },
              ],
            },
          ],
        },
      ],
      errors: [{ message: "Error: global set-up failed" }],
    };
    expect(playwrightFailures(report)).toEqual([
      "playwright [timed] classroom.spec.ts:102 › a follower sees the move (unexpected): Error: expect(received).toBeLessThan(expected)",
      "playwright: Error: global set-up failed",
    ]);
  });
});
