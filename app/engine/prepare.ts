import { fallFromRatio, parseFall, type Fall } from "./fall";
import { signedArea } from "./geometry/area";
import { nearestOnSegment, orient, segmentsTouch } from "./geometry/segments";
import { insidePolygon } from "./geometry/inside";
import type { AreaPart, Hole, Outlet, Roof } from "./roof";
import { boundaryDistance, cutOutlineAlongRidges, insideOrOn, pointInside, type Face } from "./areas";
import { offsetFromOutlets } from "./setout";
import { DEFAULT_RULE_SET, RULE_SETS, ruleValue, type RuleSetId, type UsedRule } from "./rule-sets";
import type { EdgeKind, Point, RoofSpec } from "./types";
import { outletName } from "./names";

export interface SpecIssue {
  path: string;
  message: string;
}

export type Prepared = { ok: true; roof: Roof } | { ok: false; status: 400 | 422; issues: SpecIssue[] };

/** Limits from docs/roof-method.md §1 and issue 4. */
export const LIMITS = {
  maxVertices: 200,
  maxArea: 100_000,
  maxJoists: 5_000,
  maxProbes: 1_000,
  /** An outlet must sit within this distance of a parapet edge (metres). */
  outletSnap: 0.001,
  /** Edges shorter than this are treated as zero-length (metres). */
  minEdge: 0.001,
} as const;

/** Defaults that no code gives (docs/check-values.md, "common practice, no source"). */
export const DEFAULTS = {
  joistSpacing: 0.4,
  outletSize: 0.1,
  /** Design rainfall when none is given: an assumption, reported as a warning. */
  rainfallIntensity: 75,
} as const;

const fail = (status: 400 | 422, path: string, message: string): Prepared => ({
  ok: false,
  status,
  issues: [{ path, message }],
});

function fallOr(input: string | number | undefined, fallback: number): Fall {
  if (input === undefined) return fallFromRatio(fallback);
  const parsed = parseFall(input);
  return parsed.ok ? fallFromRatio(parsed.ratio) : fallFromRatio(fallback);
}

/**
 * Normalises a shape-checked spec (drops a repeated closing point, fixes winding) and checks the
 * geometry: self-crossing, zero-length edges, area, outlets on parapet edges, a drain at all,
 * joist count. Never throws for a shape-valid spec.
 */
export function prepareRoof(spec: RoofSpec): Prepared {
  let pts: Point[] = spec.outline.map((p) => [p[0], p[1]]);
  let kinds: EdgeKind[] | undefined = spec.edges ? [...spec.edges] : undefined;
  const first = pts[0];
  const last = pts[pts.length - 1];
  if (pts.length > 3 && Math.hypot(first[0] - last[0], first[1] - last[1]) <= LIMITS.minEdge) {
    pts = pts.slice(0, -1);
    if (kinds && kinds.length === pts.length + 1) kinds = kinds.slice(0, -1);
  }
  const n = pts.length;
  if (n > LIMITS.maxVertices) return fail(400, "outline", `allows at most ${LIMITS.maxVertices} vertices (got ${n})`);
  if (kinds && kinds.length !== n) return fail(400, "edges", `needs one kind per edge: ${n} (got ${kinds.length})`);

  for (let i = 0; i < n; i++) {
    const a = pts[i];
    const b = pts[(i + 1) % n];
    if (Math.hypot(b[0] - a[0], b[1] - a[1]) < LIMITS.minEdge)
      return fail(422, `outline.${i}`, `edge ${i} from vertex ${i} to vertex ${(i + 1) % n} has zero length`);
  }
  const crossing = findCrossing(pts);
  if (crossing) return fail(422, "outline", crossing);

  const ox = pts.reduce((s, p) => s + p[0], 0) / n;
  const oy = pts.reduce((s, p) => s + p[1], 0) / n;
  let xs = Float64Array.from(pts, (p) => p[0] - ox);
  let ys = Float64Array.from(pts, (p) => p[1] - oy);
  let area = signedArea(xs, ys);
  const absArea = Math.abs(area);
  if (absArea < 1e-6) return fail(422, "outline", "encloses no area");
  if (absArea > LIMITS.maxArea)
    return fail(422, "outline", `encloses ${Math.round(absArea)} m², over the limit of ${LIMITS.maxArea} m²`);

  const userVertex = new Int32Array(n);
  const userEdge = new Int32Array(n);
  for (let i = 0; i < n; i++) userVertex[i] = userEdge[i] = i;
  if (area < 0) {
    // Reverse to counter-clockwise. Internal edge j joins reversed vertices j, j+1, which is request edge n-2-j.
    xs = xs.reverse();
    ys = ys.reverse();
    for (let j = 0; j < n; j++) {
      userVertex[j] = n - 1 - j;
      userEdge[j] = (((n - 2 - j) % n) + n) % n;
    }
    area = -area;
  }
  const eaves = new Uint8Array(n);
  const len = new Float64Array(n);
  let perimeter = 0;
  for (let j = 0; j < n; j++) {
    eaves[j] = kinds?.[userEdge[j]] === "eaves" ? 1 : 0;
    const k = (j + 1) % n;
    len[j] = Math.hypot(xs[k] - xs[j], ys[k] - ys[j]);
    perimeter += len[j];
  }
  const reflex = new Uint8Array(n);
  let convex = true;
  for (let j = 0; j < n; j++) {
    const p = (j + n - 1) % n;
    const q = (j + 1) % n;
    if (orient(xs[p], ys[p], xs[j], ys[j], xs[q], ys[q]) < 0) {
      reflex[j] = 1;
      convex = false;
    }
  }
  let extent = 0;
  for (let j = 0; j < n; j++) extent = Math.max(extent, Math.abs(xs[j]), Math.abs(ys[j]));
  const tol = 1e-9 * Math.max(1, extent);

  const holesOrIssue = prepareHoles(spec, pts, ox, oy);
  if (!Array.isArray(holesOrIssue)) return holesOrIssue;
  const holes = holesOrIssue;

  // Outlets: snap each onto the nearest parapet edge, or onto a vertex when within the snap distance.
  const outlets: Outlet[] = [];
  const specOutlets = spec.outlets ?? [];
  for (let k = 0; k < specOutlets.length; k++) {
    const o = specOutlets[k];
    const px = o.at[0] - ox;
    const py = o.at[1] - oy;
    let best = -1;
    let bestDistance = Infinity;
    let nearestEaves = Infinity;
    for (let j = 0; j < n; j++) {
      const q = (j + 1) % n;
      const d = nearestOnSegment(xs[j], ys[j], xs[q], ys[q], px, py).distance;
      if (eaves[j]) {
        nearestEaves = Math.min(nearestEaves, d);
        continue;
      }
      // Equal distances happen at corners: prefer the longer edge, so joists span the short way.
      // Lengths equal to rounding (a square, or a turned copy of one) keep the earlier edge, so
      // moving or turning the whole spec never flips the choice.
      if (d < bestDistance - tol || (Math.abs(d - bestDistance) <= tol && best >= 0 && len[j] > len[best] + tol)) {
        best = j;
        bestDistance = d;
      }
    }
    if (best < 0 || bestDistance > LIMITS.outletSnap) {
      const why =
        nearestEaves <= LIMITS.outletSnap
          ? "sits on an eaves edge: outlets go on parapet edges (an eaves edge drains by itself)"
          : `is ${formatDistance(Math.min(bestDistance, nearestEaves))} from the nearest parapet edge; an outlet must be within 1 mm of one`;
      return fail(422, `outlets.${k}.at`, `outlet ${outletName(k)} ${why}`);
    }
    const q = (best + 1) % n;
    const snap = nearestOnSegment(xs[best], ys[best], xs[q], ys[q], px, py);
    let x = snap.x;
    let y = snap.y;
    let t = snap.s * len[best];
    let vertex = -1;
    if (t <= LIMITS.outletSnap) {
      vertex = best;
      t = 0;
    } else if (len[best] - t <= LIMITS.outletSnap) {
      vertex = q;
      t = len[best];
    }
    if (vertex >= 0) {
      x = xs[vertex];
      y = ys[vertex];
    }
    const size = o.size ?? DEFAULTS.outletSize;
    outlets.push({ index: k, x, y, u: 0, v: 0, edge: best, t, vertex, level: o.level ?? 0, size, radius: size / 2 });
  }
  const anyEaves = eaves.some((e) => e === 1);
  if (outlets.length === 0 && !anyEaves)
    return fail(422, "outlets", "no outlet and no eaves edge: the water has nowhere to go");

  // Joist direction: given, or the inward normal of the first outlet's edge, else of the first eaves edge.
  let dx: number;
  let dy: number;
  if (spec.joists?.direction) {
    const [gx, gy] = spec.joists.direction;
    const m = Math.hypot(gx, gy);
    dx = gx / m + 0;
    dy = gy / m + 0;
  } else {
    let edge = outlets.length ? outlets[0].edge : -1;
    if (edge < 0) {
      const firstUserEaves = [...Array(n).keys()].filter((j) => eaves[j]).sort((a, b) => userEdge[a] - userEdge[b])[0];
      edge = firstUserEaves;
    }
    const q = (edge + 1) % n;
    // For a counter-clockwise outline the inward normal is the edge direction turned left.
    // "+ 0" turns -0 into 0, which reads better in JSON and in tests.
    dx = -(ys[q] - ys[edge]) / len[edge] + 0;
    dy = (xs[q] - xs[edge]) / len[edge] + 0;
  }
  const { us, vs, umin, umax, vmin, vmax } = frameOf(xs, ys, len, outlets, dx, dy, tol);
  frameHoles(holes, dx, dy, us, tol);

  const spacing = spec.joists?.spacing ?? DEFAULTS.joistSpacing;
  const fromOutlets = spec.joists?.fromOutlets === true;
  const offset = fromOutlets ? offsetFromOutlets(outlets, umin, umax, spacing) : (spec.joists?.offset ?? 0);
  const joistCount = Math.floor(Math.max(0, umax - umin - offset) / spacing) + 2;
  if (joistCount > LIMITS.maxJoists)
    return fail(
      422,
      "joists.spacing",
      `${spacing} m spacing across ${formatDistance(umax - umin)} gives ${joistCount} joists, over the limit of ${LIMITS.maxJoists}`,
    );

  const drainTop = Math.max(anyEaves ? 0 : -Infinity, ...outlets.map((o) => o.level));
  const highLevelGiven = spec.highLevel ?? null;
  if (highLevelGiven !== null && highLevelGiven <= drainTop)
    return fail(422, "highLevel", `must be above every drain (the highest drain is at ${drainTop} m)`);

  const ruleSet = (spec.ruleSet ?? DEFAULT_RULE_SET) as RuleSetId;
  const used: UsedRule[] = [];
  const rule = (key: Parameters<typeof ruleValue>[1]) => {
    const r = ruleValue(ruleSet, key);
    if (r) used.push(r);
    return r;
  };
  const baseFall = fallOr(spec.baseFall, 40);
  rule("fieldFall");
  const minFall = spec.minFall !== undefined ? fallOr(spec.minFall, 100) : fallFromRatio(rule("fallLine")!.value);
  const gutterWidth = spec.gutter?.width ?? rule("gutterWidth")!.value;
  const gutterDepth = spec.gutter?.depth ?? rule("gutterDepth")!.value;
  const gutterFall =
    spec.gutter?.fall !== undefined ? fallOr(spec.gutter.fall, 100) : fallFromRatio(rule("gutterFall")!.value);
  for (const key of ["pondingCheckBelow", "overflowOpening", "sumpDepth", "gutterRainfallFactor"] as const) {
    if (RULE_SETS[ruleSet].values[key]) rule(key);
  }

  const roof: Roof = {
    n,
    xs,
    ys,
    ox,
    oy,
    userEdge,
    userVertex,
    eaves,
    len,
    area,
    perimeter,
    convex,
    reflex,
    dx,
    dy,
    us,
    vs,
    umin,
    umax,
    vmin,
    vmax,
    outlets,
    baseFall,
    minFall,
    gutter: { width: gutterWidth, depth: gutterDepth, fall: gutterFall },
    rainfall: spec.rainfall
      ? { intensity: spec.rainfall.intensity, assumed: false }
      : { intensity: DEFAULTS.rainfallIntensity, assumed: true },
    ruleSet,
    used,
    spacing,
    offset,
    fromOutlets,
    highLevelGiven,
    probes: (spec.probes ?? []).map((p) => [p[0], p[1]]),
    holes,
    holeArea: holes.reduce((sum, h) => sum + h.area, 0),
    tol,
    parts: [],
    crickets: [],
    ridges: (spec.ridges ?? []).map((r, index) => ({
      index,
      kind: r.kind ?? "divide",
      line: r.line.map((p): Point => [p[0], p[1]]),
    })),
  };
  for (const r of roof.ridges) {
    if (r.kind !== "cricket") continue;
    const [a, b] = r.line;
    for (const p of [a, b]) {
      if (!insideOrOn(pts, p, LIMITS.outletSnap))
        return fail(422, `ridges.${r.index}.line`, `cricket ${r.index + 1} runs off the roof at (${p[0]}, ${p[1]})`);
    }
    if (Math.hypot(b[0] - a[0], b[1] - a[1]) < LIMITS.minEdge)
      return fail(422, `ridges.${r.index}.line`, `cricket ${r.index + 1} has no length`);
    roof.crickets.push({ index: r.index, x0: a[0] - ox, y0: a[1] - oy, x1: b[0] - ox, y1: b[1] - oy });
  }
  const dividing = roof.ridges.filter((r) => r.kind === "divide");
  if (!dividing.length) {
    if (spec.areas?.length)
      return fail(422, "areas.0.at", "names a drainage area, but no ridge divides the roof: set the roof's own joists");
    return { ok: true, roof };
  }
  const parts = prepareParts(spec, pts, kinds, roof, dividing);
  if (!Array.isArray(parts)) return parts;
  roof.parts = parts;
  return { ok: true, roof };
}

/**
 * The drainage areas of a roof divided by ridges (docs/roof-method-plans.md P4), each prepared as
 * a roof of its own whose outlets, openings and eaves edges keep the whole roof's request numbers.
 */
function prepareParts(
  spec: RoofSpec,
  pts: Point[],
  kinds: EdgeKind[] | undefined,
  whole: Roof,
  dividing: Roof["ridges"],
): AreaPart[] | Prepared {
  const snap = LIMITS.outletSnap;
  const rings = (spec.openings ?? []).map((o) => o.outline);
  const division = cutOutlineAlongRidges(
    pts,
    dividing.map((r) => [r.index, r.line]),
    rings,
    snap,
  );
  if (!division.ok) return fail(422, division.path, division.message);
  const faces = division.faces;
  const strictlyIn = (f: Face, p: Point) =>
    insidePolygon(
      f.pts.map((q) => q[0]),
      f.pts.map((q) => q[1]),
      p[0],
      p[1],
    ) && boundaryDistance(f.pts, p) > snap;

  const entryOf = new Map<number, number>();
  const settings = spec.areas ?? [];
  for (let k = 0; k < settings.length; k++) {
    const holding = faces.flatMap((f, i) => (strictlyIn(f, settings[k].at) ? [i] : []));
    if (holding.length !== 1)
      return fail(422, `areas.${k}.at`, "is not inside a drainage area: it lies on a ridge or outside the roof");
    const other = entryOf.get(holding[0]);
    if (other !== undefined) return fail(422, `areas.${k}.at`, `names the same drainage area as areas.${other}.at`);
    entryOf.set(holding[0], k);
  }

  // Each outlet belongs to the area whose outline walls hold it; one at a ridge's end is refused.
  const outletFace = new Map<number, number>();
  for (const o of whole.outlets) {
    const p: Point = [o.x + whole.ox, o.y + whole.oy];
    for (const r of dividing) {
      for (const end of [r.line[0], r.line[r.line.length - 1]]) {
        if (Math.hypot(end[0] - p[0], end[1] - p[1]) <= snap * 1.5)
          return fail(
            422,
            `outlets.${o.index}.at`,
            `outlet ${outletName(o.index)} sits at the end of ridge ${r.index + 1}: move it off the ridge, into one area`,
          );
      }
    }
    const f = faces.findIndex((face) =>
      face.tags.some((tag, i) => {
        if (tag.kind !== "outline") return false;
        const a = face.pts[i],
          b = face.pts[(i + 1) % face.pts.length];
        return nearestOnSegment(a[0], a[1], b[0], b[1], p[0], p[1]).distance <= snap;
      }),
    );
    outletFace.set(o.index, f);
  }

  const probes = spec.probes ?? [];
  const probeFace = probes.map((p) => faces.findIndex((f) => insideOrOn(f.pts, p, snap)));
  const parts: AreaPart[] = [];
  for (let f = 0; f < faces.length; f++) {
    const face = faces[f];
    const entry = entryOf.get(f);
    const at = entry !== undefined ? settings[entry].at : pointInside(face.pts);
    const outlets = whole.outlets.filter((o) => outletFace.get(o.index) === f);
    const edgeKinds = face.tags.map((t): EdgeKind =>
      t.kind === "outline" ? (kinds?.[t.edge] ?? "parapet") : "parapet",
    );
    if (!outlets.length && !edgeKinds.includes("eaves"))
      return fail(
        422,
        entry !== undefined ? `areas.${entry}.at` : "ridges",
        `the drainage area around (${+at[0].toFixed(3)}, ${+at[1].toFixed(3)}) has no outlet and no eaves edge: the water has nowhere to go. Add an outlet on its walls or move a ridge.`,
      );
    const openings = rings.flatMap((ring, i) => (insideOrOn(face.pts, ring[0], 0) ? [i] : []));
    const own = entry !== undefined ? settings[entry].joists : undefined;
    const sub: RoofSpec = {
      outline: face.pts,
      edges: edgeKinds,
      outlets: outlets.map((o) => ({
        at: [o.x + whole.ox, o.y + whole.oy],
        level: o.level,
        size: o.size,
      })),
      baseFall: spec.baseFall,
      ...(spec.minFall !== undefined ? { minFall: spec.minFall } : {}),
      ...(spec.gutter ? { gutter: spec.gutter } : {}),
      ...(spec.rainfall ? { rainfall: spec.rainfall } : {}),
      ...(spec.ruleSet ? { ruleSet: spec.ruleSet } : {}),
      joists: {
        spacing: own?.spacing ?? spec.joists?.spacing,
        direction: own?.direction ?? spec.joists?.direction,
        offset: own?.offset ?? spec.joists?.offset,
        fromOutlets: spec.joists?.fromOutlets,
      },
      openings: openings.map((i) => spec.openings![i]),
      probes: probeFace.flatMap((pf, i) => (pf === f ? [probes[i]] : [])),
    };
    const prepared = prepareRoof(sub);
    if (!prepared.ok) {
      const issue = prepared.issues[0];
      const path = issue.path.startsWith("joists")
        ? entry !== undefined
          ? `areas.${entry}.${issue.path}`
          : issue.path
        : issue.path.startsWith("openings.")
          ? issue.path.replace(/^openings\.(\d+)/, (_, j: string) => `openings.${openings[Number(j)]}`)
          : issue.path.startsWith("outline")
            ? "ridges"
            : issue.path;
      return fail(
        prepared.status,
        path,
        `in the drainage area around (${+at[0].toFixed(3)}, ${+at[1].toFixed(3)}): ${issue.message}`,
      );
    }
    const roof = prepared.roof;
    roof.outlets.forEach((o, j) => (o.index = outlets[j].index));
    roof.holes.forEach((h, j) => (h.index = openings[j]));
    const tagOf = face.tags;
    roof.userEdge = roof.userEdge.map((e) => (tagOf[e].kind === "outline" ? (tagOf[e] as { edge: number }).edge : -1));
    roof.crickets = whole.crickets
      .filter((c) => insideOrOn(face.pts, [c.x0 + whole.ox, c.y0 + whole.oy], snap))
      .map((c) => ({
        ...c,
        x0: c.x0 + whole.ox - roof.ox,
        y0: c.y0 + whole.oy - roof.oy,
        x1: c.x1 + whole.ox - roof.ox,
        y1: c.y1 + whole.oy - roof.oy,
      }));
    parts.push({
      id: f,
      at,
      outline: face.pts,
      roof,
      probes: probeFace.flatMap((pf, i) => (pf === f ? [i] : [])),
    });
  }
  return parts;
}

/**
 * The joist frame of an outline (u across the joists, v along them) for the unit direction
 * (dx, dy); sets each outlet's u and v. Shared by preparation and the joist direction advice.
 */
export function frameOf(
  xs: Float64Array,
  ys: Float64Array,
  len: Float64Array,
  outlets: Outlet[],
  dx: number,
  dy: number,
  tol: number,
): { us: Float64Array; vs: Float64Array; umin: number; umax: number; vmin: number; vmax: number } {
  const n = xs.length;
  const us = new Float64Array(n);
  const vs = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    us[j] = xs[j] * dy - ys[j] * dx;
    vs[j] = xs[j] * dx + ys[j] * dy;
  }
  // An edge that is along the joists up to rounding (after a rotation, say) is made exactly so:
  // the chord rule reads lines through vertices by exact comparisons of u.
  const byU = [...us.keys()].sort((a, b) => us[a] - us[b]);
  for (let k = 1; k < n; k++) {
    if (us[byU[k]] - us[byU[k - 1]] <= tol * 0.01) us[byU[k]] = us[byU[k - 1]];
  }
  let umin = Infinity,
    umax = -Infinity,
    vmin = Infinity,
    vmax = -Infinity;
  for (let j = 0; j < n; j++) {
    umin = Math.min(umin, us[j]);
    umax = Math.max(umax, us[j]);
    vmin = Math.min(vmin, vs[j]);
    vmax = Math.max(vmax, vs[j]);
  }
  for (const o of outlets) {
    if (o.vertex >= 0) {
      o.u = us[o.vertex];
      o.v = vs[o.vertex];
    } else {
      // Along its edge in the frame, so an outlet on an edge that runs along the joists shares
      // that edge's (snapped) u exactly, however the spec is turned.
      const q = (o.edge + 1) % n;
      const s = o.t / len[o.edge];
      o.u = us[o.edge] + s * (us[q] - us[o.edge]);
      o.v = vs[o.edge] + s * (vs[q] - vs[o.edge]);
    }
  }

  return { us, vs, umin, umax, vmin, vmax };
}

/**
 * The same roof with joists along another unit direction (spacing and offset kept), or null
 * when that direction would need more joists than the limit.
 */
export function withJoistDirection(roof: Roof, dx: number, dy: number): Roof | null {
  const outlets = roof.outlets.map((o) => ({ ...o }));
  const frame = frameOf(roof.xs, roof.ys, roof.len, outlets, dx, dy, roof.tol);
  const count = Math.floor(Math.max(0, frame.umax - frame.umin - roof.offset) / roof.spacing) + 2;
  if (count > LIMITS.maxJoists) return null;
  const holes = roof.holes.map((h) => ({ ...h, us: new Float64Array(h.xs.length), vs: new Float64Array(h.xs.length) }));
  frameHoles(holes, dx, dy, frame.us, roof.tol);
  return { ...roof, dx: dx + 0, dy: dy + 0, outlets, ...frame, holes, probes: [] };
}

/**
 * The openings in the joist frame. As with the outline (frameOf), positions across the joists
 * equal up to rounding are made exactly equal, here among all openings' vertices and onto an
 * outline vertex's: an opening's side along the joists, turned with the roof, must stay one mesh
 * line, not two lines a rounding apart with a sliver slab between them that routes the water
 * held on its high side differently after every move (docs/roof-method-plans.md P2, P3).
 */
function frameHoles(holes: Hole[], dx: number, dy: number, outlineUs: Float64Array, tol: number): void {
  for (const h of holes) {
    for (let j = 0; j < h.xs.length; j++) {
      h.us[j] = h.xs[j] * dy - h.ys[j] * dx;
      h.vs[j] = h.xs[j] * dx + h.ys[j] * dy;
    }
  }
  if (!holes.length) return;
  const near = tol * 0.01;
  const fixed = Float64Array.from(outlineUs).sort();
  const all: { h: Hole; j: number }[] = holes.flatMap((h) => [...h.us.keys()].map((j) => ({ h, j })));
  for (const { h, j } of all) {
    // The nearest outline u by bisection.
    let lo = 0;
    let hi = fixed.length - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (fixed[mid] < h.us[j]) lo = mid;
      else hi = mid;
    }
    for (const k of [lo, hi]) if (Math.abs(fixed[k] - h.us[j]) <= near) h.us[j] = fixed[k];
  }
  all.sort((a, b) => a.h.us[a.j] - b.h.us[b.j]);
  for (let k = 1; k < all.length; k++) {
    const prev = all[k - 1].h.us[all[k - 1].j];
    const cur = all[k];
    if (cur.h.us[cur.j] - prev <= near) cur.h.us[cur.j] = prev;
  }
}

/** Default upstand height (m): common practice, no source. */
export const DEFAULT_UPSTAND = 0.15;

/**
 * Openings (docs/roof-method-plans.md P2): each a simple polygon strictly inside the outline, not
 * touching it nor another opening. Returns them in the local frame (u, v set later), or the 422.
 */
function prepareHoles(spec: RoofSpec, outline: Point[], ox: number, oy: number): Hole[] | Prepared {
  const holes: Hole[] = [];
  const rings: Point[][] = [];
  const list = spec.openings ?? [];
  const n = outline.length;
  const oxs = outline.map((p) => p[0]);
  const oys = outline.map((p) => p[1]);
  for (let i = 0; i < list.length; i++) {
    const path = `openings.${i}.outline`;
    let ring: Point[] = list[i].outline.map((p) => [p[0], p[1]]);
    const a = ring[0],
      b = ring[ring.length - 1];
    if (ring.length > 3 && Math.hypot(a[0] - b[0], a[1] - b[1]) <= LIMITS.minEdge) ring = ring.slice(0, -1);
    if (ring.length > 50) return fail(400, path, "allows at most 50 vertices");
    for (let k = 0; k < ring.length; k++) {
      const p = ring[k],
        q = ring[(k + 1) % ring.length];
      if (Math.hypot(q[0] - p[0], q[1] - p[1]) < LIMITS.minEdge)
        return fail(422, path, `opening ${i + 1}: edge ${k} has zero length`);
    }
    const crossing = findCrossing(ring);
    if (crossing) return fail(422, path, `opening ${i + 1}: ${crossing}`);
    const area = Math.abs(
      signedArea(
        ring.map((p) => p[0]),
        ring.map((p) => p[1]),
      ),
    );
    if (area < 1e-6) return fail(422, path, `opening ${i + 1} encloses no area`);
    for (const p of ring) {
      if (!insidePolygon(oxs, oys, p[0], p[1]))
        return fail(422, path, `opening ${i + 1} lies outside the roof outline at (${p[0]}, ${p[1]})`);
    }
    for (let k = 0; k < ring.length; k++) {
      const p = ring[k],
        q = ring[(k + 1) % ring.length];
      for (let j = 0; j < n; j++) {
        const c = outline[j],
          d = outline[(j + 1) % n];
        const near = Math.min(
          nearestOnSegment(c[0], c[1], d[0], d[1], p[0], p[1]).distance,
          nearestOnSegment(p[0], p[1], q[0], q[1], c[0], c[1]).distance,
        );
        if (segmentsTouch(p[0], p[1], q[0], q[1], c[0], c[1], d[0], d[1]) || near < LIMITS.minEdge)
          return fail(
            422,
            path,
            `opening ${i + 1} crosses or touches the roof outline (outline edge ${j}): an opening must lie inside it`,
          );
      }
    }
    for (let m = 0; m < rings.length; m++) {
      const other = rings[m];
      const touching = ring.some((p, k) => {
        const q = ring[(k + 1) % ring.length];
        return other.some((c, j) => {
          const d = other[(j + 1) % other.length];
          return segmentsTouch(p[0], p[1], q[0], q[1], c[0], c[1], d[0], d[1]);
        });
      });
      const inside =
        insidePolygon(
          other.map((p) => p[0]),
          other.map((p) => p[1]),
          ring[0][0],
          ring[0][1],
        ) ||
        insidePolygon(
          ring.map((p) => p[0]),
          ring.map((p) => p[1]),
          other[0][0],
          other[0][1],
        );
      if (touching || inside)
        return fail(422, path, `opening ${i + 1} overlaps or touches opening ${m + 1}: openings must stand apart`);
    }
    rings.push(ring);
    holes.push({
      index: i,
      kind: list[i].kind ?? "other",
      upstand: list[i].upstand ?? DEFAULT_UPSTAND,
      xs: Float64Array.from(ring, (p) => p[0] - ox),
      ys: Float64Array.from(ring, (p) => p[1] - oy),
      us: new Float64Array(ring.length),
      vs: new Float64Array(ring.length),
      area,
    });
  }
  return holes;
}

function formatDistance(m: number): string {
  return m < 1 ? `${Math.round(m * 1000)} mm` : `${m.toFixed(2)} m`;
}

/** First self-crossing found, as a message naming the edges (request numbering), or null. */
export function findCrossing(pts: Point[]): string | null {
  const n = pts.length;
  for (let i = 0; i < n; i++) {
    const a = pts[i];
    const b = pts[(i + 1) % n];
    // Adjacent edges may only share their common vertex: a fold back along the same line overlaps.
    const c = pts[(i + 2) % n];
    if (orient(a[0], a[1], b[0], b[1], c[0], c[1]) === 0) {
      const dot = (b[0] - a[0]) * (c[0] - b[0]) + (b[1] - a[1]) * (c[1] - b[1]);
      if (dot < 0) return `edges ${i} and ${(i + 1) % n} fold back over each other at vertex ${(i + 1) % n}`;
    }
    for (let j = i + 2; j < n; j++) {
      if (i === 0 && j === n - 1) continue;
      const p = pts[j];
      const q = pts[(j + 1) % n];
      if (segmentsTouch(a[0], a[1], b[0], b[1], p[0], p[1], q[0], q[1]))
        return `edges ${i} and ${j} cross or touch: the outline must be a simple polygon`;
    }
  }
  return null;
}
