// The outbox: what the local mail service received, for coordinators to check what funders would get.
import { Router } from "express";
import type { Db } from "../db/client";
import { allow } from "../auth/guard";
import { parseId } from "../http/validate";
import { listOutbox, outboxAttachment } from "./outbox";

export function outboxRoutes(db: Db): Router {
  const router = Router();
  router.use("/outbox", allow("sendReport"));

  router.get("/outbox", (_req, res) => {
    res.json({ messages: listOutbox(db) });
  });

  router.get("/outbox/:id/attachment/:index", async (req, res) => {
    const index = Number(req.params.index);
    const attachment = await outboxAttachment(db, parseId(req.params.id), Number.isInteger(index) && index >= 0 ? index : -1);
    // only types the report itself sends keep their type; anything else downloads as plain bytes
    const safeType = ["application/pdf", "text/csv"].includes(attachment.contentType) ? attachment.contentType : "application/octet-stream";
    // attachment() also sets a type from the name's extension; the safe type set after it wins
    res.attachment(attachment.filename).type(safeType).set("X-Content-Type-Options", "nosniff").send(attachment.content);
  });

  return router;
}
