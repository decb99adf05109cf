import { describe, expect, it } from "vitest";
import { parseBody } from "~/lib/lessons/body";
import { roofFigureBlock } from "~/lib/lessons/lesson-form";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";

describe("a figure block made from a saved roof", () => {
  it("reads back through the lesson loader's body parser as one plan figure of that roof, caption and all", () => {
    // A name with quotes, a colon and a hash: YAML would misread it unquoted.
    const name = 'North wing: "B" #2';
    const body = `Some text.\n\n${roofFigureBlock(name, DEMO_ROOF)}\n`;
    const { blocks, issues } = parseBody(body, 1);
    expect(issues).toEqual([]);
    const figures = blocks.flatMap((b) => (b.type === "roof" ? [b.figure] : []));
    expect(figures).toHaveLength(1);
    expect(figures[0].caption).toBe(name);
    expect(figures[0].view).toBe("plan");
    const spec = figures[0].spec as typeof DEMO_ROOF;
    expect(spec.outline).toEqual(DEMO_ROOF.outline);
    expect(spec.outlets).toEqual(DEMO_ROOF.outlets);
  });
});
