import { memo } from "react";

interface Frame {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Drafting grid in plan metres: fine lines at the snap step, heavier ones every metre (or 5 m, 10 m on large plans). */
export const PlanGrid = memo(function PlanGrid({ frame, step }: { frame: Frame; step: number }) {
  const span = Math.max(frame.width, frame.height);
  let fine = step;
  while (span / fine > 120) fine *= 2;
  const major = span > 200 ? 10 : span > 40 ? 5 : 1;
  const lines: { d: string; strong: boolean }[] = [];
  const x0 = Math.floor(frame.x / fine) * fine;
  const y0 = Math.floor(frame.y / fine) * fine;
  const isMajor = (v: number) => Math.abs(v / major - Math.round(v / major)) < 1e-6;
  for (let x = x0; x <= frame.x + frame.width; x += fine) {
    lines.push({ d: `M${x} ${frame.y}V${frame.y + frame.height}`, strong: isMajor(x) });
  }
  for (let y = y0; y <= frame.y + frame.height; y += fine) {
    lines.push({ d: `M${frame.x} ${y}H${frame.x + frame.width}`, strong: isMajor(y) });
  }
  const weak = lines
    .filter((l) => !l.strong)
    .map((l) => l.d)
    .join("");
  const strong = lines
    .filter((l) => l.strong)
    .map((l) => l.d)
    .join("");
  return (
    <g aria-hidden="true" pointerEvents="none">
      <path
        d={weak}
        stroke="var(--color-rule)"
        strokeOpacity={0.35}
        strokeWidth={1}
        vectorEffect="non-scaling-stroke"
      />
      <path
        d={strong}
        stroke="var(--color-rule)"
        strokeOpacity={0.9}
        strokeWidth={1}
        vectorEffect="non-scaling-stroke"
      />
    </g>
  );
});
