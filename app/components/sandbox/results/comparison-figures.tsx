import { FallRatio } from "./fall-ratio";
import { useFormat } from "../format";
import { useSandbox } from "../state/store";

/** The figures that set the shaped roof beside the gutter layout and the open edge. */
export function ComparisonFigures() {
  const { metres, mm, area } = useFormat();
  const analysis = useSandbox((s) => s.analysis);
  if (!analysis) return null;
  const { shaped, gutter, openEdge, comparison } = analysis;
  const rows: [string, React.ReactNode, React.ReactNode, React.ReactNode][] = [
    [
      "High level (build-up height)",
      mm(shaped.highLevel),
      gutter.comparable ? mm(gutter.highLevel) : "–",
      mm(openEdge.highLevel),
    ],
    [
      "Flattest fall on the water's path",
      <FallRatio key="s" ratio={comparison.flattestFall.shaped} />,
      gutter.comparable ? <FallRatio key="g" ratio={comparison.flattestFall.gutter} /> : "–",
      <FallRatio key="o" ratio={analysis.baseFall.ratio} />,
    ],
    ["Internal gutter length", "none", gutter.comparable ? metres(gutter.gutterLength) : "–", "none"],
    ["Gutter sole area", "none", gutter.comparable ? area(gutter.soleArea) : "–", "none"],
    [
      "Membrane changes of plane (detail length)",
      "none",
      gutter.comparable ? metres(gutter.detailLength, 1) : "–",
      "none",
    ],
    [
      "Outlets in a gutter too narrow for a clamped outlet",
      "–",
      gutter.comparable
        ? gutter.narrowGutterOutlets.length
          ? gutter.narrowGutterOutlets.map((i) => `O${i + 1}`).join(", ")
          : "none"
        : "–",
      "–",
    ],
  ];
  return (
    <section aria-labelledby="comparison-title" className="card" data-testid="comparison">
      <h2 id="comparison-title" className="mb-2 text-lg font-bold">
        Side-by-side figures
      </h2>
      {!gutter.comparable && <p className="mb-2 text-sm text-warn">Gutter layout not comparable: {gutter.reason}</p>}
      <div className="overflow-x-auto">
        <table className="data-table w-full">
          <thead>
            <tr>
              <th scope="col"></th>
              <th scope="col" className="text-right">
                Shaped roof
              </th>
              <th scope="col" className="text-right">
                Gutter layout
              </th>
              <th scope="col" className="text-right">
                Open edge {openEdge.edge + 1}
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map(([label, a, b, c]) => (
              <tr key={label}>
                <th scope="row" className="font-normal">
                  {label}
                </th>
                <td className="text-right">{a}</td>
                <td className="text-right">{b}</td>
                <td className="text-right">{c}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-sm">
        {comparison.heightSaved == null ? (
          "No height comparison: the gutter layout cannot be built simply here."
        ) : comparison.heightSaved >= 0 ? (
          <>
            Shaping the roof saves <strong data-testid="height-saved">{mm(comparison.heightSaved)}</strong> of build-up
            height against the gutter layout, with no internal gutter to detail.
          </>
        ) : (
          <>
            Here the gutter layout is <strong data-testid="height-saved">{mm(-comparison.heightSaved)}</strong> lower
            than the shaped roof.
          </>
        )}{" "}
        An open edge needs {mm(openEdge.highLevel)}, if the building allows external spouting on edge{" "}
        {openEdge.edge + 1}.
      </p>
    </section>
  );
}
