import { useCallback, useRef, useState } from "react";
import { Link, useFetcher, useNavigate, useRouteLoaderData, useSearchParams } from "react-router";
import { Download, GraduationCap } from "lucide-react";
import type { RoofSpec } from "~/engine";
import type { CheckListItem } from "~/components/as-built/check-list";
import { PackDownloads } from "~/components/pack/downloads";
import type { SandboxStore } from "~/components/sandbox/state/store";
import { newRequestKey } from "~/lib/request-key";
import { ROOF_NAME_MAX, roofNameSchema, type UnderlaySettings } from "~/lib/roof-file";
import { can, type Role } from "~/lib/permissions";
import type { RoofPageActionData } from "~/lib/roof-page";
import type { RoofVersionRow } from "~/lib/roofs.server";
import type { ShareLinkRow } from "~/lib/share-links.server";
import { ReadOnlyBanner } from "./read-only-banner";
import { RoofHistory } from "./roof-history";
import { RoofWorkspace, retraceSpec } from "./roof-workspace";
import { ConflictBanner, SaveStatus } from "./save-status";
import { ShareControls } from "./share-controls";
import { ShareLinks } from "./share-links";
import { UnderlayPanel } from "./underlay-panel";
import { useAutosave, type RoofSnapshot } from "./use-autosave";
import { VersionHistory } from "./version-history";

/** What the roof page's loader gives the editor. */
export interface RoofEditorProps {
  roof: {
    id: string;
    name: string;
    version: number;
    shared: boolean;
    canEdit: boolean;
    ownerName: string;
    spec: RoofSpec;
  };
  underlay: UnderlaySettings | null;
  underlayUrl: string | null;
  versions: RoofVersionRow[];
  shareLinks: ShareLinkRow[];
  checks: CheckListItem[];
}

/**
 * A saved roof's page: its name, sharing, downloads, history and the workspace, saved as it is
 * edited (useAutosave), with the conflict banner when someone else saved first.
 */
export function RoofEditor({
  roof,
  underlay: initialUnderlay,
  underlayUrl: initialUrl,
  versions,
  shareLinks,
  checks,
}: RoofEditorProps) {
  const navigate = useNavigate();
  // Trainers and admins turn a saved roof into a lesson task (docs/authoring.md).
  const shell = useRouteLoaderData("routes/_shell") as { user?: { role: Role } | null } | undefined;
  const canAuthor = can(shell?.user?.role, "lessons:author");
  const [params] = useSearchParams();
  const autosave = useAutosave(roof.id, roof.version, { enabled: roof.canEdit });
  const queue = autosave.queue;
  const [mounted, setMounted] = useState<{ spec: RoofSpec; epoch: number }>({ spec: roof.spec, epoch: 0 });
  const current = useRef<RoofSpec>(roof.spec);
  const [outline, setOutline] = useState<[number, number][]>(outlineOf(roof.spec));
  const [name, setName] = useState(roof.name);
  const [nameError, setNameError] = useState<string | null>(null);
  const [underlay, setUnderlayState] = useState<UnderlaySettings | null>(initialUnderlay);
  const [imageUrl, setImageUrl] = useState<string | null>(initialUrl);
  const [copyError, setCopyError] = useState<string | null>(null);
  /** One key per "keep mine as a copy": a double click or a retry makes one copy. */
  const copyKey = useRef<string | null>(null);
  const underlayFetcher = useFetcher<RoofPageActionData>();
  const store = useRef<SandboxStore | null>(null);
  const onStore = useCallback((s: SandboxStore | null) => {
    store.current = s;
  }, []);
  const underlayTimer = useRef<ReturnType<typeof setTimeout> | null>(null);

  const replaceSpec = useCallback((spec: RoofSpec) => {
    current.current = spec;
    setOutline(outlineOf(spec));
    setMounted((m) => ({ spec, epoch: m.epoch + 1 }));
  }, []);

  const onSpecChange = useCallback(
    (spec: RoofSpec) => {
      if (JSON.stringify(spec) === JSON.stringify(current.current)) return;
      current.current = spec;
      setOutline(outlineOf(spec));
      queue({ spec });
    },
    [queue],
  );

  function rename(value: string) {
    setName(value);
    const checked = roofNameSchema.safeParse(value);
    setNameError(checked.success ? null : `The name ${checked.error.issues[0].message}.`);
    if (checked.success) autosave.queue({ name: checked.data });
  }

  function saveUnderlay(next: UnderlaySettings) {
    setUnderlayState(next);
    if (underlayTimer.current) clearTimeout(underlayTimer.current);
    underlayTimer.current = setTimeout(() => {
      underlayFetcher.submit({ intent: "underlay", settings: JSON.stringify(next) }, { method: "post" });
    }, 400);
  }

  const conflict = autosave.state.kind === "conflict" ? autosave.state.current : null;
  function reloadTheirs(theirs: RoofSnapshot) {
    replaceSpec(theirs.spec);
    setName(theirs.name);
    autosave.adopt(theirs.version);
  }
  async function keepMineAsCopy() {
    setCopyError(null);
    copyKey.current ??= newRequestKey();
    const res = await fetch("/api/v1/roofs", {
      method: "POST",
      headers: { "Content-Type": "application/json", "Idempotency-Key": copyKey.current },
      body: JSON.stringify({
        name: `${name.trim() || roof.name} (my copy)`.slice(0, ROOF_NAME_MAX),
        spec: current.current,
      }),
    }).catch(() => null);
    const body = await res?.json().catch(() => null);
    if (res?.status === 201) navigate(`/roofs/${body.id}?copied=1`);
    else setCopyError(body?.error?.message ?? "The copy could not be saved. Your changes are still here; try again.");
  }

  const notice = params.has("saved")
    ? "Saved to your roofs."
    : params.has("imported")
      ? "Imported into your roofs."
      : params.has("copied")
        ? "This is your copy."
        : null;
  const underlayProp = underlay && imageUrl ? { url: imageUrl, ...underlay } : undefined;

  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div className="min-w-72 flex-1">
          <p className="text-sm text-ink-soft">
            <Link className="underline" to="/roofs">
              My roofs
            </Link>{" "}
            /
          </p>
          {roof.canEdit ? (
            <div>
              <label htmlFor="roof-name" className="sr-only">
                Roof name
              </label>
              <input
                id="roof-name"
                value={name}
                onChange={(e) => rename(e.target.value)}
                maxLength={140}
                aria-invalid={nameError ? true : undefined}
                aria-describedby={nameError ? "roof-name-error" : undefined}
                className="w-full max-w-2xl rounded border border-transparent bg-transparent px-1 text-xl font-bold tracking-tight sm:text-3xl hover:border-rule focus:border-ink focus:bg-sheet"
              />
              {nameError ? (
                <p id="roof-name-error" className="field-error">
                  {nameError}
                </p>
              ) : null}
            </div>
          ) : (
            <h1 className="text-3xl font-bold tracking-tight">{roof.name}</h1>
          )}
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {roof.canEdit ? <SaveStatus state={autosave.state} /> : null}
          {roof.canEdit ? <ShareControls shared={roof.shared} /> : null}
          <a className="btn" href={`/roofs/${roof.id}/export`} download>
            <Download aria-hidden="true" className="h-4 w-4" /> Export roof file
          </a>
          {canAuthor ? (
            <a className="btn" href={`/lessons/new?roof=${roof.id}`} data-testid="make-task">
              <GraduationCap aria-hidden="true" className="h-4 w-4" /> Make this roof a task
            </a>
          ) : null}
        </div>
      </header>
      {roof.canEdit ? <h1 className="sr-only">{name}</h1> : null}
      <PackDownloads base={`/roofs/${roof.id}`} sheetPage={`/roofs/${roof.id}/sheet`} />
      {roof.canEdit ? <ShareLinks links={shareLinks} /> : null}
      <RoofHistory roofId={roof.id} version={roof.version} checks={checks} canEdit={roof.canEdit} />

      {notice ? (
        <p role="status" className="rounded border border-ok/40 bg-sheet px-3 py-2 text-sm text-ok">
          {notice}
        </p>
      ) : null}
      {!roof.canEdit ? <ReadOnlyBanner owner={roof.ownerName} name={roof.name} /> : null}
      {conflict ? (
        <ConflictBanner
          current={conflict}
          onReload={() => reloadTheirs(conflict)}
          onKeepMine={() => void keepMineAsCopy()}
          error={copyError}
        />
      ) : null}

      <div className="grid items-start gap-4 lg:grid-cols-[3fr_2fr]">
        {roof.canEdit || imageUrl ? (
          <UnderlayPanel
            roofId={roof.id}
            settings={underlay}
            imageUrl={imageUrl}
            outline={outline}
            canEdit={roof.canEdit}
            onSettings={saveUnderlay}
            onUploaded={(settings, url) => {
              setUnderlayState(settings);
              setImageUrl(url);
            }}
            onTrace={(traced) => {
              const spec = retraceSpec(current.current, traced);
              // An undoable edit in the workspace when it is there; onSpecChange then saves it.
              if (store.current) store.current.getState().replaceSpec(spec);
              else {
                replaceSpec(spec);
                autosave.queue({ spec });
              }
            }}
          />
        ) : null}
        {roof.canEdit ? (
          <VersionHistory
            versions={versions}
            busy={autosave.state.kind !== "saved"}
            expected={autosave.currentVersion}
            onRestored={(r) => {
              replaceSpec(r.spec);
              setName(r.name);
              autosave.adopt(r.version);
            }}
          />
        ) : null}
      </div>

      <RoofWorkspace
        key={mounted.epoch}
        initialSpec={mounted.spec}
        onSpecChange={onSpecChange}
        readOnly={!roof.canEdit}
        underlay={underlayProp}
        onStore={onStore}
      />
    </div>
  );
}

function outlineOf(spec: RoofSpec): [number, number][] {
  return spec.outline.filter((p) => Array.isArray(p) && p.length === 2);
}
