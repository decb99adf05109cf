import { Printer } from "lucide-react";
import { useMemo, useState } from "react";
import type { Analysis, RoofSpec } from "~/engine";
import { sheetData, type SheetTable } from "~/lib/pack/sheet-data";
import { Caution } from "~/components/caution";
import { PlanFigureSvg } from "./plan-figure-svg";

type Paper = "A4" | "letter";

/** Print rules: the chosen paper, whole blocks kept together, table headings repeated on each page. */
const printCss = (paper: Paper) => `
@page { size: ${paper}; margin: 12mm; }
@media print {
  html, body { background: white !important; }
  body { font-size: 10pt; }
  .sheet-block { break-inside: avoid; }
  .sheet-table thead { display: table-header-group; }
  .sheet-table tr { break-inside: avoid; }
}`;

function Block({
  title,
  children,
  whole = true,
  testId,
}: {
  title: string;
  children: React.ReactNode;
  whole?: boolean;
  testId?: string;
}) {
  // A long table may break between rows (its heading repeats); everything else stays whole.
  return (
    <section className={`${whole ? "sheet-block" : ""} mt-5`} data-testid={testId}>
      <h2 className="mb-1.5 break-after-avoid border-b-2 border-ink pb-0.5 text-sm font-bold uppercase tracking-wide">
        {title}
      </h2>
      {children}
    </section>
  );
}

function Table({ t, testId }: { t: SheetTable; testId?: string }) {
  return (
    <>
      <table className="data-table sheet-table card-table w-full" data-testid={testId}>
        <thead>
          <tr>
            {t.header.map((h, i) => (
              <th key={i} className={t.numeric[i] ? "text-right" : ""}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {t.rows.map((r, k) => (
            <tr key={k}>
              {r.map((c, i) => (
                <td key={i} className={t.numeric[i] ? "text-right tabular-nums" : ""} data-label={t.header[i]}>
                  {c}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      {t.note && <p className="mt-1 text-xs text-ink-soft">{t.note}</p>}
    </>
  );
}

/**
 * The check sheet as a document: titled with the roof's name, one caution, the plan with labels
 * that keep off lines and each other, the figures, every table in full (no scroll box, nothing
 * loaded later, so print and full-page captures keep it), the rule set and its sources; A4 or
 * US Letter. The same words and tables as the PDF (app/lib/pack/sheet-data.ts).
 */
export function CheckSheet({
  name,
  spec,
  analysis,
  back,
  pdfHref,
}: {
  name: string;
  spec: RoofSpec;
  analysis: Analysis;
  back: React.ReactNode;
  pdfHref?: string;
}) {
  const [paper, setPaper] = useState<Paper>("A4");
  const data = useMemo(() => sheetData({ name, date: new Date(), spec, analysis }), [name, spec, analysis]);
  const schedule = data.tables[data.tables.length - 1];
  return (
    <article
      className="mx-auto max-w-4xl bg-sheet p-6 shadow-[2px_2px_0_0_var(--color-rule)] print:max-w-none print:bg-white print:p-0 print:shadow-none"
      data-testid="check-sheet"
    >
      <style>{printCss(paper)}</style>
      <header className="flex flex-wrap items-start justify-between gap-3 border-b-2 border-ink pb-2">
        <div>
          <p className="text-xs font-medium uppercase tracking-widest text-accent">Fallwright · check sheet</p>
          <h1 className="text-2xl font-bold tracking-tight">{data.title}</h1>
          <p className="text-sm text-ink-soft">{data.subtitle}</p>
        </div>
        <span className="no-print flex flex-wrap items-center gap-2">
          {back}
          <label className="flex items-center gap-1 text-sm">
            Paper
            <select
              className="field w-auto px-1 py-0.5"
              value={paper}
              onChange={(e) => setPaper(e.target.value as Paper)}
              data-testid="sheet-paper"
            >
              <option value="A4">A4</option>
              <option value="letter">US Letter</option>
            </select>
          </label>
          {pdfHref && (
            <a className="btn" href={`${pdfHref}${paper === "letter" ? "?paper=letter" : ""}`} download>
              PDF
            </a>
          )}
          <button type="button" className="btn-primary" onClick={() => window.print()}>
            <Printer size={16} aria-hidden="true" /> Print
          </button>
        </span>
      </header>
      <div className="mt-3">
        <Caution />
      </div>

      <div className="sheet-block mt-4 grid gap-4 md:grid-cols-[3fr_2fr] print:grid-cols-[3fr_2fr]">
        <figure>
          <PlanFigureSvg name={name} spec={spec} analysis={analysis} className="h-auto w-full border border-rule" />
          <figcaption className="mt-1 text-xs text-ink-soft">
            Plan. Levels in mm above datum at corners and outlets (O1, O2…); dashed: the longest fall line; thin lines:
            joists.
          </figcaption>
        </figure>
        <dl className="grid content-start gap-y-1 text-sm">
          {data.figures.map(([k, v]) => (
            <div key={k} className="flex justify-between gap-3 border-b border-rule py-0.5">
              <dt className="text-ink-soft">{k}</dt>
              <dd className="text-right font-medium tabular-nums">{v}</dd>
            </div>
          ))}
        </dl>
      </div>

      {data.tables.slice(0, -1).map((t) => (
        <Block key={t.title} title={t.title}>
          <Table t={t} />
        </Block>
      ))}

      <Block title="Warnings and advice">
        <ul className="list-disc pl-5 text-sm">
          {data.warnings.map((w, i) => (
            <li key={i}>{w}</li>
          ))}
          {data.warnings.length === 0 && <li>No warnings.</li>}
        </ul>
      </Block>

      <Block title={schedule.title} whole={schedule.rows.length <= 30}>
        <Table t={schedule} testId="sheet-schedule" />
      </Block>

      <Block title={data.ruleSet.title}>
        <p className="text-sm font-medium">{data.ruleSet.name}</p>
        <ul className="mt-1 list-disc pl-5 text-sm">
          {data.ruleSet.lines.map((l) => (
            <li key={l}>{l}</li>
          ))}
        </ul>
        {data.ruleSet.notes.map((n) => (
          <p key={n} className="mt-1 text-xs text-ink-soft">
            {n}
          </p>
        ))}
      </Block>
    </article>
  );
}
