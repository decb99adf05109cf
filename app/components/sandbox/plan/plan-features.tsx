import type { KeyboardEvent, MouseEvent, PointerEvent } from "react";
import type { Point, RoofSpec } from "~/engine";
import { usePointerWords } from "../../use-pointer-words";

/** A handle's touch area around an opening's corner, half its side in screen px (WCAG 2.2 2.5.8: 24 × 24). */
const CORNER_HIT = 12;
/** Half the side of a ridge point's touch area, in screen px (44 × 44, as the outline's corners). */
const POINT_HIT = 22;

type FeatureDrag =
  | { kind: "opening"; index: number; from: Point; outline: Point[] }
  | { kind: "opening-corner"; index: number; sub: number }
  | { kind: "ridge-point"; index: number; sub: number };
type FeatureFocus = { kind: "opening" | "opening-corner" | "ridge-point"; index: number; sub?: number };

/**
 * The openings' and ridges' handles on the plan (the shapes themselves are drawn by PlanOverlays):
 * an opening's body drags it and, once chosen, its corners resize it; a ridge's points drag, and a
 * double-click on a ridge adds a bend there. Every handle takes focus and the keyboard's edits.
 */
export function PlanFeatures(props: {
  spec: RoofSpec;
  px: number;
  active: string | null;
  label: (metres: number) => string;
  onStart: (e: PointerEvent<SVGElement>, target: FeatureDrag) => void;
  onMove: (e: PointerEvent<SVGElement>) => void;
  onEnd: (e: PointerEvent<SVGElement>) => void;
  onFocus: (f: FeatureFocus) => void;
  onOpeningKey: (e: KeyboardEvent<SVGElement>, i: number) => void;
  onCornerKey: (e: KeyboardEvent<SVGElement>, i: number, c: number) => void;
  onRidgePointKey: (e: KeyboardEvent<SVGElement>, i: number, j: number) => void;
  onRidgeDoubleClick: (e: MouseEvent<SVGElement>, i: number, piece: number) => void;
  onKeyUp: () => void;
  toPlan: (clientX: number, clientY: number) => Point;
  helpId: string;
}) {
  const { spec, px, active, label: len_ } = props;
  const { doubleClick } = usePointerWords();
  const drag = { onPointerMove: props.onMove, onPointerUp: props.onEnd, onPointerCancel: props.onEnd };
  const d = (pts: Point[], closed: boolean) =>
    pts.map((p, k) => `${k ? "L" : "M"}${p[0]} ${-p[1]}`).join("") + (closed ? "Z" : "");
  return (
    <g data-testid="plan-features">
      {(spec.openings ?? []).map((o, i) => {
        const chosen = active === `opening-${i}` || !!active?.startsWith(`opening-corner-${i}-`);
        const size = extent(o.outline);
        return (
          <g key={`op${i}`}>
            <path
              d={d(o.outline, true)}
              data-handle={`opening-${i}`}
              fill="transparent"
              stroke={chosen ? "var(--color-accent)" : "transparent"}
              strokeWidth={3}
              vectorEffect="non-scaling-stroke"
              tabIndex={0}
              role="button"
              aria-label={`Opening ${i + 1}, ${o.kind ?? "other"}, ${len_(size.w)} by ${len_(size.h)}, from x ${len_(size.x)}, y ${len_(size.y)}: drag or arrow keys to move, Delete to remove`}
              aria-describedby={props.helpId}
              className="cursor-move outline-none focus-visible:stroke-accent"
              onPointerDown={(e) => {
                const from = props.toPlan(e.clientX, e.clientY);
                props.onStart(e, { kind: "opening", index: i, from, outline: o.outline });
              }}
              {...drag}
              onFocus={() => props.onFocus({ kind: "opening", index: i })}
              onKeyDown={(e) => props.onOpeningKey(e, i)}
              onKeyUp={props.onKeyUp}
              data-testid={`plan-opening-${i}-body`}
            />
            {chosen &&
              o.outline.map((q, c) => (
                <g
                  key={c}
                  data-handle={`opening-corner-${i}-${c}`}
                  tabIndex={0}
                  role="button"
                  aria-label={`Corner ${c + 1} of opening ${i + 1} at x ${len_(q[0])}, y ${len_(q[1])}: drag or arrow keys to resize`}
                  aria-describedby={props.helpId}
                  className="cursor-nwse-resize outline-none"
                  onPointerDown={(e) => props.onStart(e, { kind: "opening-corner", index: i, sub: c })}
                  {...drag}
                  onFocus={() => props.onFocus({ kind: "opening-corner", index: i, sub: c })}
                  onKeyDown={(e) => props.onCornerKey(e, i, c)}
                  onKeyUp={props.onKeyUp}
                  data-testid={`plan-opening-${i}-corner-${c}`}
                >
                  <rect
                    x={q[0] - CORNER_HIT * px}
                    y={-q[1] - CORNER_HIT * px}
                    width={2 * CORNER_HIT * px}
                    height={2 * CORNER_HIT * px}
                    fill="transparent"
                  />
                  <rect
                    x={q[0] - 4 * px}
                    y={-q[1] - 4 * px}
                    width={8 * px}
                    height={8 * px}
                    fill={active === `opening-corner-${i}-${c}` ? "var(--color-accent)" : "var(--color-sheet)"}
                    stroke="var(--color-accent-deep)"
                    strokeWidth={2}
                    vectorEffect="non-scaling-stroke"
                  />
                </g>
              ))}
          </g>
        );
      })}
      {(spec.ridges ?? []).map((r, i) => (
        <g key={`r${i}`}>
          {r.line.slice(0, -1).map((a, piece) => (
            <path
              key={piece}
              d={d([a, r.line[piece + 1]], false)}
              stroke="transparent"
              strokeWidth={16}
              vectorEffect="non-scaling-stroke"
              className="cursor-copy"
              onPointerDown={(e) => e.stopPropagation()}
              onDoubleClick={(e) => props.onRidgeDoubleClick(e, i, piece)}
              data-testid={`plan-ridge-${i}-piece-${piece}`}
            >
              <title>{`Ridge ${i + 1}: ${doubleClick} to add a bend here`}</title>
            </path>
          ))}
          {r.line.map((q, j) => {
            const end = j === 0 || j === r.line.length - 1;
            const on = active === `ridge-point-${i}-${j}`;
            const s = (end ? 6 : 5) * px;
            return (
              <g
                key={j}
                data-handle={`ridge-point-${i}-${j}`}
                tabIndex={0}
                role="button"
                aria-label={`Ridge ${i + 1} ${end ? (j === 0 ? "start" : "end") : `bend ${j}`} at x ${len_(q[0])}, y ${len_(q[1])}: drag or arrow keys to move, Delete to remove${end ? " the ridge" : ""}, + to add a bend`}
                aria-describedby={props.helpId}
                className="cursor-move outline-none"
                onPointerDown={(e) => props.onStart(e, { kind: "ridge-point", index: i, sub: j })}
                {...drag}
                onFocus={() => props.onFocus({ kind: "ridge-point", index: i, sub: j })}
                onKeyDown={(e) => props.onRidgePointKey(e, i, j)}
                onKeyUp={props.onKeyUp}
                data-testid={`plan-ridge-${i}-point-${j}`}
              >
                <circle cx={q[0]} cy={-q[1]} r={POINT_HIT * px} fill="transparent" />
                {end ? (
                  <circle
                    cx={q[0]}
                    cy={-q[1]}
                    r={s}
                    fill={on ? "var(--color-accent)" : "var(--color-sheet)"}
                    stroke="var(--color-ink)"
                    strokeWidth={2}
                    vectorEffect="non-scaling-stroke"
                  />
                ) : (
                  <path
                    d={`M${q[0]} ${-q[1] - s}L${q[0] + s} ${-q[1]}L${q[0]} ${-q[1] + s}L${q[0] - s} ${-q[1]}Z`}
                    fill={on ? "var(--color-accent)" : "var(--color-sheet)"}
                    stroke="var(--color-ink)"
                    strokeWidth={2}
                    vectorEffect="non-scaling-stroke"
                  />
                )}
              </g>
            );
          })}
        </g>
      ))}
    </g>
  );
}

/** The ridge or opening being drawn: its points so far and the next one under the pointer. */
export function DrawPreview({
  tool,
  draft,
  hover,
  px,
}: {
  tool: "ridge" | "opening";
  draft: Point[];
  hover: Point | null;
  px: number;
}) {
  const pts = hover ? [...draft, hover] : draft;
  if (pts.length === 0) return null;
  const style = {
    fill: "none",
    stroke: "var(--color-accent-deep)",
    strokeWidth: 2.5,
    strokeDasharray: "6 3",
    vectorEffect: "non-scaling-stroke" as const,
  };
  return (
    <g pointerEvents="none" data-testid="plan-draw-preview">
      {tool === "ridge" ? (
        pts.length >= 2 && <path d={pts.map((p, k) => `${k ? "L" : "M"}${p[0]} ${-p[1]}`).join("")} {...style} />
      ) : pts.length >= 2 ? (
        <rect
          x={Math.min(pts[0][0], pts[1][0])}
          y={-Math.max(pts[0][1], pts[1][1])}
          width={Math.abs(pts[1][0] - pts[0][0])}
          height={Math.abs(pts[1][1] - pts[0][1])}
          {...style}
        />
      ) : null}
      {pts.map((p, k) => (
        <circle key={k} cx={p[0]} cy={-p[1]} r={4 * px} fill="var(--color-accent-deep)" />
      ))}
    </g>
  );
}

function extent(pts: Point[]) {
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  const x = Math.min(...xs);
  const y = Math.min(...ys);
  return { x, y, w: Math.max(...xs) - x, h: Math.max(...ys) - y };
}
