import { parseSpec, type RoofSpec } from "~/engine";
import { decodeSpec } from "./sheet-link";

/** The roof carried by a page's `spec` query parameter (base64url JSON), checked by the engine. */
export function readLinkedSpec(url: URL): {
  spec: RoofSpec | null;
  error: { status: 400 | 422; message: string } | null;
} {
  const raw = url.searchParams.get("spec");
  if (raw == null) return { spec: null, error: null };
  const decoded = decodeSpec(raw);
  if (decoded == null)
    return {
      spec: null,
      error: { status: 400, message: "The roof in this link could not be read (it is not base64url JSON)." },
    };
  const parsed = parseSpec(decoded);
  if (!parsed.ok) return { spec: null, error: { status: parsed.status, message: parsed.error.message } };
  return { spec: parsed.spec, error: null };
}
