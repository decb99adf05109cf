import { Box, FileDown, FileSpreadsheet, FileText, PenTool } from "lucide-react";

/** What each file of the builder's pack is, for the download lists. */
export const PACK_LINKS = [
  { file: "sheet.pdf", label: "Check sheet (PDF, A4)", icon: FileText },
  { file: "sheet.pdf?paper=letter", label: "Check sheet (PDF, US Letter)", icon: FileText },
  { file: "schedule.csv", label: "Drop schedule (CSV)", icon: FileSpreadsheet },
  { file: "plan.dxf", label: "Plan (DXF, metres)", icon: PenTool },
  { file: "roof.glb", label: "3D model (glTF .glb)", icon: Box },
] as const;

/** Links to a saved roof's (or a share link's) files: `base` is /roofs/<id> or /s/<token>. */
export function PackDownloads({
  base,
  sheetPage,
  className = "",
}: {
  base: string;
  sheetPage?: string;
  className?: string;
}) {
  return (
    <nav
      aria-label="Downloads"
      className={`flex flex-wrap items-center gap-2 ${className}`}
      data-testid="pack-downloads"
    >
      <span className="flex items-center gap-1 text-sm font-bold">
        <FileDown aria-hidden="true" className="h-4 w-4" /> Builder's pack:
      </span>
      {sheetPage ? (
        <a className="btn py-1 text-sm" href={sheetPage} data-testid="sheet-page-link">
          <FileText aria-hidden="true" className="h-4 w-4" /> Check sheet (page)
        </a>
      ) : null}
      {PACK_LINKS.map((l) => (
        <a
          key={l.file}
          className="btn py-1 text-sm"
          href={`${base}/${l.file}`}
          download
          data-testid={`download-${l.file.replace(/\?.*$/, "").replace(".", "-")}${l.file.includes("letter") ? "-letter" : ""}`}
        >
          <l.icon aria-hidden="true" className="h-4 w-4" /> {l.label}
        </a>
      ))}
    </nav>
  );
}
