import { requireActor } from "@/server/auth/actor";
import { attachDocument, documentExtension, documentTypeOf, recoveryRow } from "@/server/club/recoveries";
import { AppError } from "@/server/errors";
import { json, readBodyLimited, route, routeId } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";
import { photoStorage } from "@/server/storage";

type Ctx = { params: Promise<{ id: string }> };
const MAX_DOCUMENT_BYTES = 4 * 1024 * 1024;

const recoveryId = (ctx: Ctx) => routeId(ctx, "recovery", "No such melt or assay.");

/** The melt's or assay's document (a PDF or a photo of it), kept with it. What it is is read from its bytes. */
export const PUT = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "club");
  const id = await recoveryId(ctx);
  recoveryRow(id);
  const bytes = await readBodyLimited(req, MAX_DOCUMENT_BYTES, "document", "A document may be at most 4 MB.");
  const type = documentTypeOf(bytes);
  if (!type) throw new AppError("unsupported:document", "Send the document as a PDF, a JPEG or a PNG.", { document: ["not a PDF, JPEG or PNG"] });
  const name = (req.headers.get("x-file-name") ?? "").replace(/[^\w .()-]/g, "_").slice(0, 120) || `document.${documentExtension(type)}`;
  const key = `d/${id}`;
  await photoStorage().put(key, bytes, type);
  attachDocument(actor, id, key, type, name);
  return json({ stored: true, type, bytes: bytes.length });
});

/** Officers read it back as a download, never rendered in the page's origin. */
export const GET = route<Ctx>(async (req, ctx) => {
  await requireActor(req, "manageClaims", "club");
  const row = recoveryRow(await recoveryId(ctx));
  const bytes = row.documentKey ? await photoStorage().get(row.documentKey) : null;
  if (!bytes || !row.documentType) throw new AppError("not_found:document", "No document is kept with this melt or assay.");
  return new Response(new Uint8Array(bytes), {
    headers: {
      "Content-Type": row.documentType,
      "Content-Disposition": `attachment; filename="${row.documentName ?? "document"}"`,
      "X-Content-Type-Options": "nosniff",
      "Content-Security-Policy": "default-src 'none'; sandbox",
      "Cache-Control": "private, no-store",
    },
  });
});
