import { useEffect, useMemo, useRef, useState } from "react";
import { data, Form, Link, redirect, useActionData, useFetcher, useNavigation } from "react-router";
import { Copy, FileUp, Pencil, Search, Trash2, Users } from "lucide-react";
import { z } from "zod";
import type { Route } from "./+types/roofs._index";
import { requirePermission } from "~/lib/auth.server";
import { readFormCapped } from "~/lib/json-api.server";
import { readRoofFile, ROOF_FILE_MAX_BYTES } from "~/lib/roof-file";
import { pgInt, uuid } from "~/lib/input";
import { parseRoofWrite } from "~/lib/roofs-api.server";
import {
  createRoof,
  duplicateRoof,
  idempotencyKeySchema,
  listMyRoofs,
  listSharedWithMe,
  restoreRoof,
  roofNameSchema,
  softDeleteRoof,
  updateRoof,
} from "~/lib/roofs.server";
import { keyReusedMessage } from "~/lib/idempotency.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { RelativeTime } from "~/components/roofs/relative-time";

export const meta: Route.MetaFunction = () => [{ title: "My roofs · Fallwright" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requirePermission(request, "roofs:own");
  const [mine, shared] = await Promise.all([listMyRoofs(user), listSharedWithMe(user)]);
  return { mine, shared, importKey: crypto.randomUUID() };
}

const intentSchema = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("duplicate"), id: uuid("a roof id") }),
  z.object({ intent: z.literal("delete"), id: uuid("a roof id") }),
  z.object({ intent: z.literal("restore"), id: uuid("a roof id") }),
  z.object({
    intent: z.literal("rename"),
    id: uuid("a roof id"),
    name: roofNameSchema,
    version: pgInt({ coerce: true }),
  }),
  z.object({ intent: z.literal("import") }),
]);

type ActionResult = { intent: string; id?: string; error?: string; name?: string; ok?: boolean };

export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "roofs:own");
  const read = await readFormCapped(request, ROOF_FILE_MAX_BYTES + 16 * 1024);
  if (!read.ok) {
    const error =
      read.status === 413 ? "That file is over 256 kB; a roof file is much smaller." : "The request could not be read.";
    return data<ActionResult>({ intent: "import", error }, { status: read.status });
  }
  const form = read.form;
  const parsed = intentSchema.safeParse(Object.fromEntries([...form].filter(([, v]) => typeof v === "string")));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = String(issue.path[0] ?? "intent");
    return data<ActionResult>(
      {
        intent: String(form.get("intent") ?? ""),
        id: String(form.get("id") ?? ""),
        name: String(form.get("name") ?? ""),
        error: field === "name" ? `The name ${issue.message}.` : `The field "${field}" ${issue.message}.`,
      },
      { status: 400 },
    );
  }
  const input = parsed.data;
  switch (input.intent) {
    case "duplicate": {
      const copy = await duplicateRoof(user, input.id);
      if (!copy) throw data("No such roof", { status: 404 });
      return data<ActionResult>({ intent: "duplicate", id: copy.id, ok: true });
    }
    case "delete":
    case "restore": {
      const result =
        input.intent === "delete" ? await softDeleteRoof(user, input.id) : await restoreRoof(user, input.id);
      if (result !== "ok") throw data("No such roof", { status: result === "forbidden" ? 403 : 404 });
      return data<ActionResult>({ intent: input.intent, id: input.id, ok: true });
    }
    case "rename": {
      const result = await updateRoof(user, input.id, { name: input.name, version: input.version });
      if (result.status === "not-found" || result.status === "forbidden") throw data("No such roof", { status: 404 });
      if (result.status === "conflict") {
        return data<ActionResult>(
          {
            intent: "rename",
            id: input.id,
            name: input.name,
            error: "This roof was changed elsewhere a moment ago; the list is now up to date. Try the rename again.",
          },
          { status: 409 },
        );
      }
      return data<ActionResult>({ intent: "rename", id: input.id, ok: true });
    }
    case "import":
      return importRoof(user, form.get("file"), form.get("idempotencyKey"));
  }
}

async function importRoof(
  user: Awaited<ReturnType<typeof requirePermission>>,
  file: FormDataEntryValue | null,
  idempotencyKey: FormDataEntryValue | null,
) {
  if (!(file instanceof File) || file.size === 0)
    return data<ActionResult>({ intent: "import", error: "Choose a roof file (.json) to import." }, { status: 400 });
  const envelope = readRoofFile(await file.text());
  if (!envelope.ok)
    return data<ActionResult>({ intent: "import", error: `${file.name}: ${envelope.message}` }, { status: 422 });
  const checked = parseRoofWrite({ name: envelope.file.name, spec: envelope.file.spec }, "create");
  if (!checked.ok) {
    return data<ActionResult>({ intent: "import", error: `${file.name}: ${checked.message}` }, { status: 422 });
  }
  const key = idempotencyKeySchema.safeParse(idempotencyKey);
  const created = await createRoof(user, {
    name: checked.name,
    spec: checked.spec,
    underlay: envelope.file.underlay ?? null,
    idempotencyKey: key.success ? key.data : null,
  });
  if ("keyReused" in created)
    return data<ActionResult>({ intent: "import", error: keyReusedMessage(created.keyReused) }, { status: 422 });
  return redirect(`/roofs/${created.id}?imported=1`);
}

type SortKey = "name" | "updated";

export default function RoofsPage({ loaderData }: Route.ComponentProps) {
  const { mine, shared } = loaderData;
  const [query, setQuery] = useState("");
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: "updated", dir: -1 });
  const [deleted, setDeleted] = useState<{ id: string; name: string } | null>(null);
  const undo = useFetcher<ActionResult>();

  const rows = useMemo(() => {
    const q = query.trim().toLowerCase();
    const found = q ? mine.filter((r) => r.name.toLowerCase().includes(q)) : mine;
    return [...found].sort((a, b) =>
      sort.key === "name"
        ? a.name.localeCompare(b.name, undefined, { sensitivity: "base" }) * sort.dir
        : (a.updatedAt < b.updatedAt ? -1 : a.updatedAt > b.updatedAt ? 1 : 0) * sort.dir,
    );
  }, [mine, query, sort]);

  useEffect(() => {
    if (!deleted) return;
    const t = setTimeout(() => setDeleted(null), 12_000);
    return () => clearTimeout(t);
  }, [deleted]);

  const sortButton = (key: SortKey, label: string) => (
    <button
      type="button"
      className="inline-flex items-center gap-1 uppercase"
      onClick={() => setSort((s) => ({ key, dir: s.key === key ? (-s.dir as 1 | -1) : key === "name" ? 1 : -1 }))}
    >
      {label}
      <span aria-hidden="true">{sort.key === key ? (sort.dir === 1 ? "▲" : "▼") : "↕"}</span>
    </button>
  );
  const ariaSort = (key: SortKey) => (sort.key === key ? (sort.dir === 1 ? "ascending" : "descending") : "none");

  return (
    <div className="space-y-8">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-bold tracking-tight">My roofs</h1>
          <p className="mt-1 text-ink-soft">
            Roofs you saved from the sandbox. Each save keeps a version you can go back to.
          </p>
        </div>
        <div className="flex flex-wrap items-start gap-3">
          <Link className="btn-primary" to="/sandbox">
            Draw a new roof
          </Link>
          <ImportForm idempotencyKey={loaderData.importKey} />
        </div>
      </header>

      {mine.length === 0 ? (
        <section className="card text-center" aria-labelledby="empty-title">
          <h2 id="empty-title" className="text-xl font-bold">
            No saved roofs yet
          </h2>
          <p className="mx-auto mt-2 max-w-prose text-ink-soft">
            Draw a roof in the sandbox and press <strong>Save to my roofs</strong>, or import a roof file someone
            exported for you.
          </p>
          <p className="mt-4">
            <Link className="btn-primary" to="/sandbox">
              Open the sandbox
            </Link>
          </p>
        </section>
      ) : (
        <section aria-labelledby="mine-title" className="card overflow-x-auto">
          <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
            <h2 id="mine-title" className="text-lg font-bold">
              Saved roofs <span className="font-normal text-ink-soft">({mine.length})</span>
            </h2>
            <label className="relative block w-full max-w-xs">
              <span className="sr-only">Search my roofs by name</span>
              <Search aria-hidden="true" className="pointer-events-none absolute left-2 top-2 h-4 w-4 text-ink-soft" />
              <input
                type="search"
                className="field pl-8"
                placeholder="Search by name"
                value={query}
                onChange={(e) => setQuery(e.target.value)}
              />
            </label>
          </div>
          {rows.length === 0 ? (
            <p className="py-6 text-center text-ink-soft">No roof name contains “{query}”.</p>
          ) : (
            <table className="data-table card-table w-full">
              <thead>
                <tr>
                  <th aria-sort={ariaSort("name")}>{sortButton("name", "Name")}</th>
                  <th aria-sort={ariaSort("updated")}>{sortButton("updated", "Last saved")}</th>
                  <th>Version</th>
                  <th>Sharing</th>
                  <th className="text-right">Actions</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((r) => (
                  <RoofRow key={r.id} roof={r} onDeleted={() => setDeleted({ id: r.id, name: r.name })} />
                ))}
              </tbody>
            </table>
          )}
        </section>
      )}

      <section aria-labelledby="shared-title" className="card overflow-x-auto">
        <h2 id="shared-title" className="mb-1 flex items-center gap-2 text-lg font-bold">
          <Users aria-hidden="true" className="h-5 w-5" /> Shared with me
        </h2>
        <p className="mb-3 text-sm text-ink-soft">
          Roofs colleagues in your organisation have shared. You can look and make your own copy.
        </p>
        {shared.length === 0 ? (
          <p className="text-sm text-ink-soft">Nothing shared with you yet.</p>
        ) : (
          <table className="data-table card-table w-full">
            <thead>
              <tr>
                <th>Name</th>
                <th>Owner</th>
                <th>Last saved</th>
                <th className="text-right">Actions</th>
              </tr>
            </thead>
            <tbody>
              {shared.map((r) => (
                <tr key={r.id}>
                  <td className="card-wide">
                    <Link className="font-medium underline" to={`/roofs/${r.id}`}>
                      {r.name}
                    </Link>
                  </td>
                  <td data-label="Owner">{r.ownerName}</td>
                  <td data-label="Last saved">
                    <RelativeTime iso={r.updatedAt} />
                  </td>
                  <td className="card-wide text-right">
                    <DuplicateButton id={r.id} name={r.name} label="Copy to my roofs" />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      {deleted ? (
        <div
          role="status"
          className="fixed bottom-4 left-1/2 z-20 flex -translate-x-1/2 items-center gap-4 rounded border-2 border-ink bg-sheet px-4 py-3 shadow-[3px_3px_0_0_var(--color-ink)]"
        >
          <span>Deleted “{deleted.name}”.</span>
          <undo.Form method="post" onSubmit={() => setTimeout(() => setDeleted(null), 0)}>
            <input type="hidden" name="intent" value="restore" />
            <input type="hidden" name="id" value={deleted.id} />
            <button className="btn" type="submit" autoFocus>
              Undo
            </button>
          </undo.Form>
          <button type="button" className="text-sm underline" onClick={() => setDeleted(null)}>
            Dismiss
          </button>
        </div>
      ) : null}
    </div>
  );
}

function RoofRow({
  roof,
  onDeleted,
}: {
  roof: Route.ComponentProps["loaderData"]["mine"][number];
  onDeleted: () => void;
}) {
  const [renaming, setRenaming] = useState(false);
  const rename = useFetcher<ActionResult>();
  const remove = useFetcher<ActionResult>();
  const input = useRef<HTMLInputElement>(null);
  const failed = rename.data?.error && rename.state === "idle" ? rename.data : null;

  useEffect(() => {
    if (rename.state === "idle" && rename.data?.ok) setRenaming(false);
  }, [rename.state, rename.data]);
  useEffect(() => {
    if (renaming) input.current?.select();
  }, [renaming]);

  const pendingName = rename.formData?.get("name");
  return (
    <tr className={remove.state !== "idle" ? "opacity-40" : undefined}>
      <td className="card-wide sm:min-w-64">
        {renaming ? (
          <rename.Form
            method="post"
            className="flex items-start gap-2"
            onKeyDown={(e) => e.key === "Escape" && setRenaming(false)}
          >
            <input type="hidden" name="intent" value="rename" />
            <input type="hidden" name="id" value={roof.id} />
            <input type="hidden" name="version" value={roof.version} />
            <div className="flex-1">
              <label className="sr-only" htmlFor={`name-${roof.id}`}>
                New name for {roof.name}
              </label>
              <input
                ref={input}
                id={`name-${roof.id}`}
                name="name"
                className="field"
                defaultValue={failed?.name ?? roof.name}
                maxLength={120}
                aria-invalid={failed ? true : undefined}
                aria-describedby={failed ? `name-error-${roof.id}` : undefined}
              />
              {failed ? (
                <p id={`name-error-${roof.id}`} className="field-error">
                  {failed.error}
                </p>
              ) : null}
            </div>
            <button className="btn-primary" type="submit">
              Save
            </button>
            <button className="btn" type="button" onClick={() => setRenaming(false)}>
              Cancel
            </button>
          </rename.Form>
        ) : (
          <Link className="font-medium underline" to={`/roofs/${roof.id}`}>
            {typeof pendingName === "string" ? pendingName : roof.name}
          </Link>
        )}
      </td>
      <td data-label="Last saved">
        <RelativeTime iso={roof.updatedAt} />
      </td>
      <td data-label="Version">v{roof.version}</td>
      <td data-label="Sharing">
        {roof.shared ? (
          <span className="rounded bg-accent-wash px-1.5 py-0.5 text-xs font-medium">Shared</span>
        ) : (
          <span className="text-ink-soft">Private</span>
        )}
      </td>
      <td className="card-wide">
        <div className="flex flex-wrap justify-end gap-1">
          <button type="button" className="btn" onClick={() => setRenaming(true)} disabled={renaming}>
            <Pencil aria-hidden="true" className="h-4 w-4" /> Rename<span className="sr-only"> {roof.name}</span>
          </button>
          <DuplicateButton id={roof.id} name={roof.name} label="Duplicate" />
          <remove.Form method="post" onSubmit={onDeleted}>
            <input type="hidden" name="intent" value="delete" />
            <input type="hidden" name="id" value={roof.id} />
            <button type="submit" className="btn">
              <Trash2 aria-hidden="true" className="h-4 w-4" /> Delete<span className="sr-only"> {roof.name}</span>
            </button>
          </remove.Form>
        </div>
      </td>
    </tr>
  );
}

function DuplicateButton({ id, name, label }: { id: string; name: string; label: string }) {
  const fetcher = useFetcher<ActionResult>();
  return (
    <fetcher.Form method="post">
      <input type="hidden" name="intent" value="duplicate" />
      <input type="hidden" name="id" value={id} />
      <button type="submit" className="btn" disabled={fetcher.state !== "idle"}>
        <Copy aria-hidden="true" className="h-4 w-4" /> {fetcher.state !== "idle" ? "Copying…" : label}
        <span className="sr-only"> {name}</span>
      </button>
    </fetcher.Form>
  );
}

function ImportForm({ idempotencyKey }: { idempotencyKey: string }) {
  const result = useActionData<ActionResult>();
  const navigation = useNavigation();
  const busy = navigation.state !== "idle" && navigation.formData?.get("intent") === "import";
  const error = result?.intent === "import" ? result.error : undefined;
  return (
    <Form method="post" encType="multipart/form-data" className="max-w-sm">
      <input type="hidden" name="intent" value="import" />
      <input type="hidden" name="idempotencyKey" value={idempotencyKey} />
      <label className="label" htmlFor="import-file">
        Import a roof file
      </label>
      <div className="flex gap-2">
        <input
          id="import-file"
          name="file"
          type="file"
          accept=".json,application/json"
          required
          className="field py-1 text-xs file:mr-2 file:rounded file:border file:border-ink file:bg-paper-deep file:px-2 file:py-0.5"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? "import-error" : undefined}
        />
        <button type="submit" className="btn" disabled={busy}>
          <FileUp aria-hidden="true" className="h-4 w-4" /> {busy ? "Importing…" : "Import"}
        </button>
      </div>
      {error ? (
        <p id="import-error" role="alert" className="field-error">
          {error}
        </p>
      ) : null}
    </Form>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
