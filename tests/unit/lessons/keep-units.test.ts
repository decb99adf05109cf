import { describe, expect, it } from "vitest";
import { keepUnitsTogether, renderInline, renderMarkdown } from "~/lib/lessons/body";

describe("a number and its unit stay on one line in lesson text", () => {
  it("joins 30 % and 16 m with a no-break space, in bold too", () => {
    const html = renderMarkdown("keep the area under **30 %** of a 16 m by 8 m roof, 140 mm high");
    expect(html).toContain("30\u00a0%");
    expect(html).toContain("16\u00a0m by 8\u00a0m");
    expect(html).toContain("140\u00a0mm");
    expect(html).not.toMatch(/\d %/);
  });

  it("leaves words that only start with a unit letter alone", () => {
    expect(keepUnitsTogether("1 more outlet, 2 metres")).toBe("1 more outlet, 2 metres");
    expect(renderInline("fall 2 %")).toBe("fall 2\u00a0%");
  });
});
