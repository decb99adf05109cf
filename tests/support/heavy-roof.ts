/**
 * The heaviest roof found for the open analysis API (issue 13, defect 10): a valid 990 × 100 m
 * roof with joists at 0.2 m (4,952 joists, under the 5,000 limit), 100 outlets and 1,000 probes.
 * With `?mesh=true&traces=true` it took about 2 s of engine time and 1.2 s of JSON here, and
 * its answer is 28 MB. Invented.
 */
export function heavyRoofSpec() {
  const outlets: { at: [number, number] }[] = [];
  // 50 outlets on each long edge, staggered so none faces another across the roof.
  for (let i = 0; i < 50; i++) {
    outlets.push({ at: [10 + i * 19.5, 0] });
    outlets.push({ at: [19.5 + i * 19.5, 100] });
  }
  const probes: [number, number][] = [];
  for (let i = 0; i < 1000; i++) probes.push([0.5 + (i % 100) * 9.85, 5 + Math.floor(i / 100) * 9.5]);
  return {
    outline: [
      [0, 0],
      [990, 0],
      [990, 100],
      [0, 100],
    ] as [number, number][],
    outlets,
    probes,
    baseFall: "1:60",
    joists: { spacing: 0.2 },
  };
}
