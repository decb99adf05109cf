import { useCallback, useEffect, useRef, useState } from "react";
import { data, Link, redirect, useFetcher, useNavigate, useRevalidator, useSearchParams } from "react-router";
import { Download, History, Link2, Share2 } from "lucide-react";
import { z } from "zod";
import type { Route } from "./+types/roofs.$id";
import { requirePermission } from "~/lib/auth.server";
import { pgInt } from "~/lib/input";
import { ROOF_NAME_MAX, roofNameSchema, underlaySettingsSchema, type UnderlaySettings } from "~/lib/roof-file";
import { duplicateRoof, getRoofFor, listVersions, restoreVersion, setShared, setUnderlay } from "~/lib/roofs.server";
import { underlayUrl } from "~/lib/underlay";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { RelativeTime } from "~/components/roofs/relative-time";
import { SaveStatus, ConflictBanner } from "~/components/roofs/save-status";
import { UnderlayPanel } from "~/components/roofs/underlay-panel";
import { useAutosave, type RoofSnapshot } from "~/components/roofs/use-autosave";
import { RoofWorkspace, retraceSpec } from "~/components/roofs/roof-workspace";
import type { SandboxStore } from "~/components/sandbox/store";
import type { RoofSpec } from "~/engine";
import { newRequestKey } from "~/lib/request-key";
import { createShareLink, listShareLinks, MAX_LINKS_PER_ROOF, revokeShareLink } from "~/lib/share-links.server";
import { PackDownloads } from "~/components/pack/downloads";
import { listChecks } from "~/lib/as-built-checks.server";
import { CheckList } from "~/components/as-built/check-list";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.roof.name ?? "Roof"} · Fallwright` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof) throw data("No roof with that id in your library.", { status: 404 });
  return {
    roof: {
      id: roof.id,
      name: roof.name,
      version: roof.version,
      shared: roof.shared,
      canEdit: roof.canEdit,
      ownerName: roof.ownerName,
      spec: roof.spec,
    },
    underlay: roof.underlay,
    underlayUrl: roof.underlayId ? underlayUrl(roof.id, roof.underlayId) : null,
    versions: roof.canEdit ? await listVersions(roof.id) : [],
    shareLinks: roof.canEdit ? await listShareLinks(roof.id) : [],
    checks: await listChecks(roof.id),
  };
}

const intentSchema = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("share"), shared: z.enum(["true", "false"]) }),
  z.object({ intent: z.literal("underlay"), settings: z.string().max(2000) }),
  z.object({
    intent: z.literal("restore-version"),
    version: pgInt({ coerce: true }),
    expected: pgInt({ coerce: true }),
  }),
  z.object({ intent: z.literal("duplicate"), name: roofNameSchema.optional() }),
  z.object({ intent: z.literal("share-link-create") }),
  z.object({ intent: z.literal("share-link-revoke"), linkId: z.string().max(100) }),
]);

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "roofs:own");
  const parsed = intentSchema.safeParse(Object.fromEntries(await request.formData()));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return data(
      { error: `That request was malformed: the field "${String(issue.path[0] ?? "intent")}" ${issue.message}.` },
      { status: 400 },
    );
  }
  const input = parsed.data;
  const notFound = () => data("No roof with that id in your library.", { status: 404 });
  switch (input.intent) {
    case "share": {
      const result = await setShared(user, params.id, input.shared === "true");
      if (result !== "ok")
        throw result === "forbidden" ? data("Only the owner can share this roof.", { status: 403 }) : notFound();
      return { shared: input.shared === "true" };
    }
    case "underlay": {
      let settings: UnderlaySettings;
      try {
        settings = underlaySettingsSchema.parse(JSON.parse(input.settings));
      } catch {
        return data({ error: "The underlay placement was not valid." }, { status: 400 });
      }
      const result = await setUnderlay(user, params.id, { settings });
      if (result !== "ok")
        throw result === "forbidden" ? data("Only the owner can move the underlay.", { status: 403 }) : notFound();
      return { underlay: settings };
    }
    case "restore-version": {
      const result = await restoreVersion(user, params.id, input.version, input.expected);
      if (result.status === "not-found") throw notFound();
      if (result.status === "forbidden") throw data("Only the owner can restore versions.", { status: 403 });
      if (result.status === "conflict") return data({ conflict: result.current }, { status: 409 });
      const roof = await getRoofFor(user, params.id);
      return { restored: { version: result.version, spec: roof!.spec, name: roof!.name, from: input.version } };
    }
    case "share-link-create": {
      const made = await createShareLink(user, params.id);
      if (made.status === "forbidden") throw data("Only the owner can share this roof by link.", { status: 403 });
      if (made.status === "not-found") throw notFound();
      if (made.status !== "ok")
        return data(
          { error: `A roof can have at most ${MAX_LINKS_PER_ROOF} links at once: revoke one first.` },
          { status: 409 },
        );
      return { shareLink: { id: made.id, path: `/s/${made.token}` } };
    }
    case "share-link-revoke": {
      const result = await revokeShareLink(user, params.id, input.linkId);
      if (result === "forbidden") throw data("Only the owner can revoke this roof's links.", { status: 403 });
      if (result === "not-found")
        return data({ error: "That link was not found; it may have been revoked already." }, { status: 404 });
      return { revoked: input.linkId };
    }
    case "duplicate": {
      const copy = await duplicateRoof(user, params.id, input.name);
      if (!copy) throw notFound();
      return redirect(`/roofs/${copy.id}?copied=1`);
    }
  }
}

type ActionData = {
  shared?: boolean;
  restored?: RoofSnapshot & { from: number };
  conflict?: RoofSnapshot;
  error?: string;
  shareLink?: { id: string; path: string };
  revoked?: string;
};

export default function RoofPage({ loaderData }: Route.ComponentProps) {
  // A different roof is a different editor: never carry drafts across.
  return <RoofEditor key={loaderData.roof.id} {...loaderData} />;
}

function RoofEditor({
  roof,
  underlay: initialUnderlay,
  underlayUrl: initialUrl,
  versions,
  shareLinks,
  checks,
}: Route.ComponentProps["loaderData"]) {
  const navigate = useNavigate();
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
  const underlayFetcher = useFetcher<ActionData>();
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

function ShareControls({ shared }: { shared: boolean }) {
  const fetcher = useFetcher<ActionData>();
  const [copied, setCopied] = useState<"yes" | "failed" | null>(null);
  const pending = fetcher.formData?.get("shared");
  const isShared = typeof pending === "string" ? pending === "true" : shared;
  async function copyLink() {
    try {
      await navigator.clipboard.writeText(window.location.origin + window.location.pathname);
      setCopied("yes");
    } catch {
      setCopied("failed");
    }
    setTimeout(() => setCopied(null), 4000);
  }
  return (
    <div className="flex items-center gap-2">
      <fetcher.Form method="post">
        <input type="hidden" name="intent" value="share" />
        <input type="hidden" name="shared" value={isShared ? "false" : "true"} />
        <button
          type="submit"
          className={isShared ? "btn-primary" : "btn"}
          role="switch"
          aria-checked={isShared}
          title="Colleagues in your organisation can open it read-only at this page's address"
        >
          <Share2 aria-hidden="true" className="h-4 w-4" />{" "}
          {isShared ? "Shared in organisation" : "Share in organisation"}
        </button>
      </fetcher.Form>
      {isShared ? (
        <button type="button" className="btn" onClick={() => void copyLink()}>
          <Link2 aria-hidden="true" className="h-4 w-4" /> {copied === "yes" ? "Link copied" : "Copy link"}
        </button>
      ) : null}
      {copied === "failed" ? (
        <span role="alert" className="text-xs text-bad">
          Copy this address from the address bar.
        </span>
      ) : null}
    </div>
  );
}

/** The roof's history: its design (the current version), then its as-built checks. */
function RoofHistory({
  roofId,
  version,
  checks,
  canEdit,
}: {
  roofId: string;
  version: number;
  checks: Route.ComponentProps["loaderData"]["checks"];
  canEdit: boolean;
}) {
  return (
    <section aria-labelledby="roof-history" className="space-y-2">
      <h2 id="roof-history" className="text-lg font-semibold">
        History: design, then as-built checks
      </h2>
      <ol className="space-y-2">
        <li className="text-sm">
          <strong>Design</strong>: version {version} (below).
        </li>
        <li className="space-y-1">
          <p className="text-sm">
            <strong>As-built checks</strong>: levels measured on the deck against the design.{" "}
            <Link to={`/roofs/${roofId}/checks`}>{canEdit ? "All checks and a new one" : "All checks"}</Link>
          </p>
          <CheckList roofId={roofId} checks={checks} limit={5} />
        </li>
      </ol>
    </section>
  );
}

function ShareLinks({ links }: { links: Route.ComponentProps["loaderData"]["shareLinks"] }) {
  const make = useFetcher<ActionData>();
  const revoke = useFetcher<ActionData>();
  const [copied, setCopied] = useState(false);
  const made = make.data?.shareLink;
  const url = made && typeof window !== "undefined" ? window.location.origin + made.path : made?.path;
  async function copy() {
    if (!url) return;
    try {
      await navigator.clipboard.writeText(url);
      setCopied(true);
      setTimeout(() => setCopied(false), 4000);
    } catch {
      setCopied(false);
    }
  }
  return (
    <section className="card" aria-labelledby="share-links-title" data-testid="share-links">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="share-links-title" className="flex items-center gap-2 text-lg font-bold">
          <Link2 aria-hidden="true" className="h-5 w-5" /> Read-only links
        </h2>
        <make.Form method="post">
          <input type="hidden" name="intent" value="share-link-create" />
          <button type="submit" className="btn" disabled={make.state !== "idle"} data-testid="share-link-create">
            {make.state !== "idle" ? "Making a link…" : "Make a read-only link"}
          </button>
        </make.Form>
      </div>
      <p className="mt-1 text-sm text-ink-soft">
        Anyone with a link sees this roof, its figures and its downloads without signing in, and cannot change it.
        Revoke a link to stop it working.
      </p>
      {make.data?.error ? (
        <p role="alert" className="mt-2 text-sm text-bad">
          {make.data.error}
        </p>
      ) : null}
      {url ? (
        <div
          className="mt-2 flex flex-wrap items-center gap-2 rounded border border-ok/40 bg-sheet px-3 py-2"
          role="status"
        >
          <label htmlFor="share-link-url" className="text-sm">
            New link (shown once; copy it now):
          </label>
          <input
            id="share-link-url"
            readOnly
            value={url}
            className="field min-w-72 flex-1 font-mono text-xs"
            data-testid="share-link-url"
            onFocus={(e) => e.currentTarget.select()}
          />
          <button type="button" className="btn" onClick={() => void copy()}>
            {copied ? "Copied" : "Copy"}
          </button>
        </div>
      ) : null}
      {revoke.data?.error ? (
        <p role="alert" className="mt-2 text-sm text-bad">
          {revoke.data.error}
        </p>
      ) : null}
      {links.length ? (
        <ul className="mt-2 divide-y divide-rule text-sm" data-testid="share-link-list">
          {links.map((l) => (
            <li key={l.id} className="flex items-center justify-between gap-2 py-1.5">
              <span>
                Link made <RelativeTime iso={l.createdAt} />
              </span>
              <revoke.Form method="post">
                <input type="hidden" name="intent" value="share-link-revoke" />
                <input type="hidden" name="linkId" value={l.id} />
                <button
                  type="submit"
                  className="btn py-0.5 text-xs"
                  disabled={revoke.state !== "idle"}
                  data-testid="share-link-revoke"
                >
                  Revoke
                </button>
              </revoke.Form>
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-2 text-sm text-ink-soft">No working links.</p>
      )}
    </section>
  );
}

function ReadOnlyBanner({ owner, name }: { owner: string; name: string }) {
  const fetcher = useFetcher();
  return (
    <div className="flex flex-wrap items-center justify-between gap-3 rounded border border-rule bg-paper-deep px-4 py-3">
      <p>
        <strong>Read-only.</strong> {owner} shared this roof with your organisation. You can look around; make your own
        copy to change it.
      </p>
      <fetcher.Form method="post">
        <input type="hidden" name="intent" value="duplicate" />
        <input type="hidden" name="name" value={`${name.slice(0, 112)} (copy)`} />
        <button className="btn-primary" type="submit" disabled={fetcher.state !== "idle"}>
          {fetcher.state !== "idle" ? "Copying…" : "Copy to my roofs"}
        </button>
      </fetcher.Form>
    </div>
  );
}

function VersionHistory({
  versions,
  busy,
  expected,
  onRestored,
}: {
  versions: Route.ComponentProps["loaderData"]["versions"];
  busy: boolean;
  expected: () => number;
  onRestored: (r: RoofSnapshot) => void;
}) {
  const revalidator = useRevalidator();
  const fetcher = useFetcher<ActionData>();
  const handled = useRef<unknown>(null);
  useEffect(() => {
    if (fetcher.state === "idle" && fetcher.data?.restored && handled.current !== fetcher.data) {
      handled.current = fetcher.data;
      onRestored(fetcher.data.restored);
      void revalidator.revalidate();
    }
  }, [fetcher.state, fetcher.data, onRestored, revalidator]);
  // Each finished save is a new version: refresh the list quietly.
  const wasBusy = useRef(busy);
  useEffect(() => {
    if (wasBusy.current && !busy) void revalidator.revalidate();
    wasBusy.current = busy;
  }, [busy, revalidator]);
  const restoredFrom = fetcher.data?.restored?.from;
  return (
    <details className="card group">
      <summary className="flex cursor-pointer list-none items-center justify-between gap-2">
        <h2 id="history-title" className="flex items-center gap-2 text-lg font-bold">
          <span aria-hidden="true" className="inline-block transition-transform group-open:rotate-90">
            ▸
          </span>
          <History aria-hidden="true" className="h-5 w-5" /> Version history
        </h2>
        <span className="text-sm text-ink-soft">
          {versions.length} {versions.length === 1 ? "version" : "versions"}
          {versions.length >= 30 ? " (latest 30)" : ""}
        </span>
      </summary>
      <div className="my-2 flex justify-end">
        <button
          type="button"
          className="btn"
          onClick={() => void revalidator.revalidate()}
          disabled={revalidator.state !== "idle"}
        >
          {revalidator.state !== "idle" ? "Refreshing…" : "Refresh"}
        </button>
      </div>
      {restoredFrom ? (
        <p role="status" className="mb-2 text-sm text-ok">
          Version {restoredFrom} restored as a new version.
        </p>
      ) : null}
      {fetcher.data?.conflict ? (
        <p role="alert" className="mb-2 text-sm text-bad">
          The roof changed elsewhere; refresh and try again.
        </p>
      ) : null}
      <ol className="max-h-80 divide-y divide-rule overflow-y-auto text-sm">
        {versions.map((v, i) => (
          <li key={v.version} className="flex items-center justify-between gap-2 py-1.5">
            <span>
              <strong>v{v.version}</strong> · {v.name}{" "}
              <span className="text-ink-soft">
                · <RelativeTime iso={v.savedAt} />
                {v.savedBy ? ` · ${v.savedBy}` : ""}
              </span>
            </span>
            {i === 0 ? (
              <span className="text-xs text-ink-soft">latest</span>
            ) : (
              <fetcher.Form method="post">
                <input type="hidden" name="intent" value="restore-version" />
                <input type="hidden" name="version" value={v.version} />
                <input type="hidden" name="expected" value={expected()} />
                <button className="btn py-0.5 text-xs" type="submit" disabled={busy || fetcher.state !== "idle"}>
                  Restore<span className="sr-only"> version {v.version}</span>
                </button>
              </fetcher.Form>
            )}
          </li>
        ))}
      </ol>
      <p className="mt-2 text-xs text-ink-soft">
        Every save is a version; restoring one makes it the newest, and nothing is overwritten.
      </p>
    </details>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
