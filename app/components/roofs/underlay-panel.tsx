import { useEffect, useId, useRef, useState, type KeyboardEvent, type MouseEvent } from "react";
import { usePointerWords } from "../use-pointer-words";
import { ImageUp, Ruler, Spline, Trash2 } from "lucide-react";
import type { UnderlaySettings } from "~/lib/roof-file";
import {
  calibrate,
  formatMetres,
  parseLength,
  pixelToPlan,
  planToPixel,
  UNDERLAY_MAX_BYTES,
  UNDERLAY_MAX_LABEL,
} from "~/lib/underlay";
import type * as PdfPage from "./pdf-page";

type Pt = [number, number];
type Mode = "scale" | "trace" | null;

/** A PDF is read in the browser and only the chosen page is uploaded, as a PNG. */
const MAX_PDF_BYTES = 50 * 1024 * 1024;

type PdfModule = typeof PdfPage;
type PdfChoice = {
  pdfs: PdfModule;
  doc: Awaited<ReturnType<PdfModule["openPdf"]>>;
  name: string;
  pages: number;
  page: string;
};

const isPdf = (file: File) => file.type === "application/pdf" || /\.pdf$/i.test(file.name);

export interface UnderlayPanelProps {
  roofId: string;
  settings: UnderlaySettings | null;
  imageUrl: string | null;
  /** The roof's current outline in plan metres, drawn over the image. */
  outline: Pt[];
  canEdit: boolean;
  onSettings: (settings: UnderlaySettings) => void;
  onUploaded: (settings: UnderlaySettings | null, url: string | null) => void;
  onTrace: (outline: Pt[]) => void;
}

const edgeLengths = (pts: Pt[], closed: boolean) =>
  pts.slice(0, closed ? pts.length : pts.length - 1).map((p, i) => {
    const q = pts[(i + 1) % pts.length];
    return Math.hypot(q[0] - p[0], q[1] - p[1]);
  });

/**
 * The plan image on its own: upload, set its scale from two points and a typed distance, trace
 * the outline over it, move it and fade it. Points can be clicked or typed (keyboard users).
 */
export function UnderlayPanel({
  roofId,
  settings,
  imageUrl,
  outline,
  canEdit,
  onSettings,
  onUploaded,
  onTrace,
}: UnderlayPanelProps) {
  const [mode, setMode] = useState<Mode>(null);
  const [points, setPoints] = useState<Pt[]>([]);
  const [distance, setDistance] = useState("");
  const [message, setMessage] = useState<{ tone: "ok" | "bad"; text: string } | null>(null);
  const [uploading, setUploading] = useState(false);
  const [working, setWorking] = useState<string | null>(null);
  const [pdf, setPdf] = useState<PdfChoice | null>(null);
  const [open, setOpen] = useState(false);
  const svg = useRef<SVGSVGElement>(null);
  const id = useId();
  const { click: clickWord, Click } = usePointerWords();

  useEffect(() => {
    setPoints([]);
  }, [mode]);

  async function upload(file: File) {
    setMessage(null);
    if (file.size > UNDERLAY_MAX_BYTES) {
      setMessage({
        tone: "bad",
        text: `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${UNDERLAY_MAX_LABEL}.`,
      });
      return;
    }
    setUploading(true);
    try {
      const form = new FormData();
      form.set("file", file);
      const res = await fetch(`/roofs/${roofId}/underlay`, { method: "POST", body: form });
      const body = await res.json().catch(() => null);
      if (!res.ok) {
        setMessage({ tone: "bad", text: body?.error?.message ?? `The upload failed (${res.status}). Try again.` });
        return;
      }
      onUploaded(body.underlay, body.url);
      setMessage({
        tone: "ok",
        text: body.keptCalibration
          ? "Image replaced; its scale and position were kept."
          : `Image uploaded. Now set its scale: ${clickWord} two points a known distance apart.`,
      });
      if (!body.keptCalibration) setMode("scale");
    } catch {
      setMessage({ tone: "bad", text: "The upload did not reach the server. Check the connection and try again." });
    } finally {
      setUploading(false);
    }
  }

  function closePdf() {
    void pdf?.doc.destroy();
    setPdf(null);
  }

  async function pick(file: File) {
    setMessage(null);
    closePdf();
    if (!isPdf(file)) return upload(file);
    if (file.size > MAX_PDF_BYTES) {
      setMessage({
        tone: "bad",
        text: `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; PDFs up to 50 MB can be read.`,
      });
      return;
    }
    setWorking("Reading the PDF…");
    try {
      const pdfs = await import("./pdf-page");
      if (!(await pdfs.looksLikePdf(file))) {
        setMessage({ tone: "bad", text: `${file.name} is not a PDF file. Pick a PDF, or a PNG, JPEG or WebP image.` });
        return;
      }
      const doc = await pdfs.openPdf(file);
      if (doc.numPages === 1) await takePdfPage({ pdfs, doc, name: file.name, pages: 1, page: "1" });
      else setPdf({ pdfs, doc, name: file.name, pages: doc.numPages, page: "1" });
    } catch {
      setMessage({
        tone: "bad",
        text: `${file.name} could not be read as a PDF (it may be damaged or password-protected).`,
      });
    } finally {
      setWorking(null);
    }
  }

  async function takePdfPage(choice: PdfChoice) {
    const n = Number(choice.page);
    if (!Number.isInteger(n) || n < 1 || n > choice.pages) {
      setMessage({ tone: "bad", text: `Pick a page from 1 to ${choice.pages}.` });
      return;
    }
    setMessage(null);
    setWorking(`Drawing page ${n} of ${choice.name}…`);
    try {
      const png = await choice.pdfs.pageAsPng(choice.doc, choice.name, n);
      setWorking(null);
      void choice.doc.destroy();
      setPdf(null);
      await upload(png);
    } catch (error) {
      setMessage({
        tone: "bad",
        text:
          error instanceof Error && error.message.includes(UNDERLAY_MAX_LABEL)
            ? error.message
            : `Page ${n} could not be drawn. Try another page or export it as an image.`,
      });
    } finally {
      setWorking(null);
    }
  }

  async function remove() {
    const res = await fetch(`/roofs/${roofId}/underlay`, { method: "DELETE" }).catch(() => null);
    if (res?.ok) {
      onUploaded(null, null);
      setMode(null);
      setMessage({ tone: "ok", text: "Underlay removed." });
    } else {
      setMessage({ tone: "bad", text: "The underlay could not be removed. Try again." });
    }
  }

  function toImage(e: MouseEvent<SVGSVGElement>): Pt | null {
    const el = svg.current;
    const ctm = el?.getScreenCTM();
    if (!el || !ctm) return null;
    const p = new DOMPoint(e.clientX, e.clientY).matrixTransform(ctm.inverse());
    return [Math.round(p.x * 10) / 10, Math.round(p.y * 10) / 10];
  }

  function click(e: MouseEvent<SVGSVGElement>) {
    if (!mode) return;
    const p = toImage(e);
    if (!p) return;
    setPoints((pts) => (mode === "scale" ? (pts.length >= 2 ? [p] : [...pts, p]) : [...pts, p]));
  }

  function applyScale() {
    if (!settings || points.length < 2) return;
    const len = parseLength(distance);
    if (!len.ok) {
      setMessage({ tone: "bad", text: len.message });
      return;
    }
    const next = calibrate(settings, points[0], points[1], len.metres);
    if (!next) {
      setMessage({ tone: "bad", text: "The two points are the same; pick two points apart." });
      return;
    }
    onSettings(next);
    const px = Math.hypot(points[1][0] - points[0][0], points[1][1] - points[0][1]);
    setMessage({
      tone: "ok",
      text: `Scale set: ${px.toFixed(1)} px = ${formatMetres(len.metres)} (${(next.metresPerPixel * 1000).toFixed(2)} mm per pixel).`,
    });
    setMode(null);
  }

  function finishTrace() {
    if (!settings || points.length < 3) return;
    onTrace(points.map(([x, y]) => pixelToPlan(settings, x, y)));
    setMessage({
      tone: "ok",
      text: `Outline traced: ${points.length} corners. Outlets moved to the nearest edge; drag them where they belong.`,
    });
    setMode(null);
  }

  function keys(e: KeyboardEvent) {
    if (e.key === "Escape") setMode(null);
    if (mode === "trace" && e.key === "Enter" && points.length >= 3) finishTrace();
    if (mode && e.key === "Backspace" && (e.target as HTMLElement).tagName !== "INPUT")
      setPoints((p) => p.slice(0, -1));
  }

  const lengthsPx = edgeLengths(points, false);
  const tracedPlan = settings ? points.map(([x, y]) => pixelToPlan(settings, x, y)) : [];
  const tracedLengths = edgeLengths(tracedPlan, false);
  const outlineLengths = edgeLengths(outline, true);
  const k = settings ? Math.max(settings.widthPx, settings.heightPx) / 600 : 1;
  const outlinePx = settings ? outline.map(([x, y]) => planToPixel(settings, x, y)) : [];

  return (
    <details className="card group" open={open} onToggle={(e) => setOpen(e.currentTarget.open)} onKeyDown={keys}>
      <summary className="flex cursor-pointer list-none items-center justify-between gap-2">
        <h2 id={`${id}-title`} className="text-lg font-bold">
          <span aria-hidden="true" className="mr-1 inline-block transition-transform group-open:rotate-90">
            ▸
          </span>
          Plan underlay
        </h2>
        <span className="text-sm text-ink-soft">
          {settings && imageUrl
            ? `${settings.widthPx} × ${settings.heightPx} px · ${(settings.metresPerPixel * 1000).toFixed(1)} mm per pixel`
            : "no image"}
        </span>
      </summary>
      <div className="mt-3 space-y-3">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <p className="text-sm text-ink-soft">
            Trace over a drawing of the plan: set its scale, then {clickWord} its corners.
          </p>
          {canEdit ? (
            <div className="flex flex-wrap gap-2">
              <label className="btn cursor-pointer">
                <ImageUp aria-hidden="true" className="h-4 w-4" />
                {uploading ? "Uploading…" : settings && imageUrl ? "Replace image" : "Upload plan image or PDF"}
                <input
                  type="file"
                  className="sr-only"
                  accept="image/png,image/jpeg,image/webp,application/pdf,.pdf"
                  disabled={uploading || working !== null}
                  aria-label={`Upload a plan image (PNG, JPEG or WebP, up to ${UNDERLAY_MAX_LABEL}) or a PDF page`}
                  onChange={(e) => {
                    const f = e.target.files?.[0];
                    e.target.value = "";
                    if (f) void pick(f);
                  }}
                />
              </label>
              {imageUrl ? (
                <button type="button" className="btn" onClick={() => void remove()}>
                  <Trash2 aria-hidden="true" className="h-4 w-4" /> Remove
                </button>
              ) : null}
            </div>
          ) : null}
        </div>
        {working ? (
          <p role="status" className="text-sm text-ink-soft">
            {working}
          </p>
        ) : null}
        {pdf ? (
          <div
            role="group"
            aria-label="Choose a page of the PDF"
            className="flex flex-wrap items-end gap-2 rounded border border-rule p-3"
          >
            <p className="w-full text-sm">
              <strong>{pdf.name}</strong> has {pdf.pages} pages. Which one shows the roof plan?
            </p>
            <label className="grid gap-1 text-sm">
              <span className="label">Page</span>
              <input
                className="field w-24"
                type="number"
                min={1}
                max={pdf.pages}
                value={pdf.page}
                autoFocus
                onChange={(e) => setPdf({ ...pdf, page: e.target.value })}
                onKeyDown={(e) => {
                  if (e.key === "Enter") {
                    e.preventDefault();
                    void takePdfPage(pdf);
                  }
                }}
              />
            </label>
            <button
              type="button"
              className="btn-primary"
              disabled={working !== null}
              onClick={() => void takePdfPage(pdf)}
            >
              Use this page
            </button>
            <button type="button" className="btn" onClick={closePdf}>
              Cancel
            </button>
          </div>
        ) : null}
        {message ? (
          <p
            role={message.tone === "bad" ? "alert" : "status"}
            className={message.tone === "bad" ? "text-sm text-bad" : "text-sm text-ok"}
          >
            {message.text}
          </p>
        ) : null}

        {!settings || !imageUrl ? (
          <p className="text-sm text-ink-soft">
            {canEdit
              ? `Upload a drawing or photo of the plan (PNG, JPEG or WebP, up to ${UNDERLAY_MAX_LABEL}, or a page of a PDF drawing) to trace over. Only you, and colleagues when the roof is shared, can see it.`
              : "No plan image on this roof."}
          </p>
        ) : (
          <>
            {canEdit ? (
              <div className="flex flex-wrap gap-2" role="group" aria-label="Underlay tools">
                <button
                  type="button"
                  className={mode === "scale" ? "btn-primary" : "btn"}
                  aria-pressed={mode === "scale"}
                  onClick={() => setMode(mode === "scale" ? null : "scale")}
                >
                  <Ruler aria-hidden="true" className="h-4 w-4" /> Set scale
                </button>
                <button
                  type="button"
                  className={mode === "trace" ? "btn-primary" : "btn"}
                  aria-pressed={mode === "trace"}
                  onClick={() => setMode(mode === "trace" ? null : "trace")}
                >
                  <Spline aria-hidden="true" className="h-4 w-4" /> Trace outline
                </button>
              </div>
            ) : null}
            {mode === "scale" ? (
              <p className="text-sm">
                {Click} two points on the image whose real distance you know (a dimensioned wall, a grid line).{" "}
                {points.length}/2 picked.
              </p>
            ) : mode === "trace" ? (
              <p className="text-sm">
                {Click} the roof's corners in order. Enter or “Use as outline” finishes; Backspace removes the last
                corner; Escape cancels.
              </p>
            ) : null}

            <svg
              ref={svg}
              viewBox={`0 0 ${settings.widthPx} ${settings.heightPx}`}
              className={`block h-auto w-full max-h-[32rem] border border-rule bg-sheet ${mode ? "cursor-crosshair" : ""}`}
              onClick={click}
              role="img"
              aria-label={`Plan image, ${settings.widthPx} by ${settings.heightPx} pixels${mode ? `; ${mode === "scale" ? "setting the scale" : "tracing the outline"}` : ""}`}
              data-testid="underlay-canvas"
            >
              <image
                href={imageUrl}
                x={0}
                y={0}
                width={settings.widthPx}
                height={settings.heightPx}
                opacity={Math.max(settings.opacity, 0.35)}
              />
              {outlinePx.length > 2 ? (
                <polygon
                  points={outlinePx.map((p) => p.join(",")).join(" ")}
                  fill="none"
                  stroke="var(--color-ink)"
                  strokeWidth={2 * k}
                  strokeDasharray={`${6 * k} ${4 * k}`}
                />
              ) : null}
              {points.length > 1 ? (
                <polyline
                  points={points.map((p) => p.join(",")).join(" ")}
                  fill="none"
                  stroke="var(--color-accent)"
                  strokeWidth={2.5 * k}
                />
              ) : null}
              {points.map((p, i) => (
                <circle
                  key={i}
                  cx={p[0]}
                  cy={p[1]}
                  r={5 * k}
                  fill="var(--color-accent)"
                  stroke="var(--color-sheet)"
                  strokeWidth={1.5 * k}
                />
              ))}
            </svg>

            {mode ? (
              <TypedPoint
                onAdd={(p) =>
                  setPoints((pts) => (mode === "scale" ? (pts.length >= 2 ? [p] : [...pts, p]) : [...pts, p]))
                }
                settings={settings}
              />
            ) : null}

            {mode === "scale" && points.length === 2 ? (
              <form
                className="flex flex-wrap items-end gap-2"
                onSubmit={(e) => {
                  e.preventDefault();
                  applyScale();
                }}
              >
                <p className="w-full text-sm text-ink-soft">Picked {lengthsPx[0].toFixed(1)} px apart.</p>
                <div>
                  <label className="label" htmlFor={`${id}-distance`}>
                    Real distance
                  </label>
                  <input
                    id={`${id}-distance`}
                    className="field w-40"
                    value={distance}
                    onChange={(e) => setDistance(e.target.value)}
                    placeholder="12 m or 12000 mm"
                    autoFocus
                  />
                </div>
                <button type="submit" className="btn-primary">
                  Set scale
                </button>
              </form>
            ) : null}

            {mode === "trace" ? (
              <div className="space-y-2">
                {tracedLengths.length ? (
                  <ol className="text-sm tabular-nums" aria-label="Traced edges">
                    {tracedLengths.map((m, i) => (
                      <li key={i}>
                        Traced edge {i + 1}: {formatMetres(m)}
                      </li>
                    ))}
                  </ol>
                ) : null}
                <div className="flex gap-2">
                  <button type="button" className="btn-primary" disabled={points.length < 3} onClick={finishTrace}>
                    Use as outline
                  </button>
                  <button
                    type="button"
                    className="btn"
                    disabled={!points.length}
                    onClick={() => setPoints((p) => p.slice(0, -1))}
                  >
                    Remove last corner
                  </button>
                </div>
              </div>
            ) : null}

            {canEdit ? <PlacementFields settings={settings} onSettings={onSettings} /> : null}

            {outlineLengths.length ? (
              <details open>
                <summary className="cursor-pointer text-sm font-medium">Outline edges over the image (dashed)</summary>
                <ol
                  className="mt-1 grid grid-cols-2 gap-x-4 text-sm tabular-nums sm:grid-cols-3"
                  aria-label="Outline edge lengths"
                >
                  {outlineLengths.map((m, i) => (
                    <li key={i}>
                      Edge {i + 1}: {formatMetres(m)}
                    </li>
                  ))}
                </ol>
              </details>
            ) : null}
          </>
        )}
      </div>
    </details>
  );
}

function PlacementFields({
  settings,
  onSettings,
}: {
  settings: UnderlaySettings;
  onSettings: (s: UnderlaySettings) => void;
}) {
  const id = useId();
  const num = (v: string, fallback: number) => (Number.isFinite(Number(v)) && v.trim() !== "" ? Number(v) : fallback);
  return (
    <fieldset className="grid grid-cols-2 gap-3 sm:grid-cols-4">
      <legend className="sr-only">Underlay placement</legend>
      <div className="col-span-2">
        <label className="label" htmlFor={`${id}-opacity`}>
          Opacity {Math.round(settings.opacity * 100)}%
        </label>
        <input
          id={`${id}-opacity`}
          type="range"
          min={0}
          max={1}
          step={0.05}
          className="w-full accent-accent"
          value={settings.opacity}
          onChange={(e) => onSettings({ ...settings, opacity: Number(e.target.value) })}
        />
      </div>
      <div>
        <label className="label" htmlFor={`${id}-x`}>
          Left edge at x (m)
        </label>
        <input
          id={`${id}-x`}
          type="number"
          step={0.1}
          className="field"
          defaultValue={settings.originX.toFixed(2)}
          key={`x${settings.originX}`}
          onBlur={(e) => onSettings({ ...settings, originX: num(e.target.value, settings.originX) })}
        />
      </div>
      <div>
        <label className="label" htmlFor={`${id}-y`}>
          Top edge at y (m)
        </label>
        <input
          id={`${id}-y`}
          type="number"
          step={0.1}
          className="field"
          defaultValue={settings.originY.toFixed(2)}
          key={`y${settings.originY}`}
          onBlur={(e) => onSettings({ ...settings, originY: num(e.target.value, settings.originY) })}
        />
      </div>
      <p className="col-span-full text-xs text-ink-soft">
        Scale: {(settings.metresPerPixel * 1000).toFixed(2)} mm per pixel · image{" "}
        {formatMetres(settings.widthPx * settings.metresPerPixel)} ×{" "}
        {formatMetres(settings.heightPx * settings.metresPerPixel)}
      </p>
    </fieldset>
  );
}

/** Keyboard route to the same points: type an image pixel position instead of clicking. */
function TypedPoint({ onAdd, settings }: { onAdd: (p: Pt) => void; settings: UnderlaySettings }) {
  const id = useId();
  const [x, setX] = useState("");
  const [y, setY] = useState("");
  const { clicking } = usePointerWords();
  const nx = Number(x);
  const ny = Number(y);
  const valid =
    x.trim() !== "" && y.trim() !== "" && nx >= 0 && ny >= 0 && nx <= settings.widthPx && ny <= settings.heightPx;
  return (
    <details className="text-sm">
      <summary className="cursor-pointer text-ink-soft">Type a point instead of {clicking}</summary>
      <div className="mt-2 flex flex-wrap items-end gap-2">
        <div>
          <label className="label" htmlFor={`${id}-x`}>
            Pixel x (0-{settings.widthPx})
          </label>
          <input
            id={`${id}-x`}
            className="field w-28"
            inputMode="decimal"
            value={x}
            onChange={(e) => setX(e.target.value)}
          />
        </div>
        <div>
          <label className="label" htmlFor={`${id}-y`}>
            Pixel y (0-{settings.heightPx}, down)
          </label>
          <input
            id={`${id}-y`}
            className="field w-28"
            inputMode="decimal"
            value={y}
            onChange={(e) => setY(e.target.value)}
          />
        </div>
        <button type="button" className="btn" disabled={!valid} onClick={() => onAdd([nx, ny])}>
          Add point
        </button>
      </div>
    </details>
  );
}
