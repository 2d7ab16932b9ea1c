// Network-insight routes: parse the filters, apply the viewer's scope, answer from the per-state cache; the
// answers that can take long on a large network are computed off the event loop (./offThread).
import { Router, type Request } from "express";
import { z } from "zod";
import {
  adjustQuerySchema,
  attemptExportQuerySchema,
  attemptListQuerySchema,
  errorsQuerySchema,
  insightFiltersSchema,
  insightFilterShape,
} from "../../shared/filters";
import { overviewChartQuerySchema } from "../../shared/schemas/chartSettings";
import type { Db } from "../db/client";
import { allow, rowScope, signedInUser } from "../auth/guard";
import { parseId, parseWith } from "../http/validate";
import { attemptDetail } from "./attempts";
import { attemptSearchKey, attemptSearchOf } from "./attemptSearch";
import { attemptsCsvFileName, writeAttemptsCsv } from "./attemptsCsv";
import { dataVersion, sendCached } from "./cache";
import { classDetail } from "./classes";
import { filtersKey, resolveFilters } from "./filters";
import { filterOptions } from "./options";
import { sendAnswer } from "../offThread/pool";
import { viewerKey, viewerOf } from "./viewer";
import { drainedOrClosed } from "../http/drained";

const rowIdSchema = z.string().trim().min(1, "Give an id").max(100, "An id has at most 100 characters");

export function insightRoutes(db: Db): Router {
  const router = Router();

  /** The viewer, the filters resolved for them and a cache key prefix for this route. */
  function context(req: Request, route: string, query: unknown = req.query) {
    const viewer = viewerOf(db, signedInUser(req));
    const filters = resolveFilters(db, parseWith(insightFiltersSchema, query, "The filters"), viewer);
    return { viewer, filters, key: `${route}|${viewerKey(viewer)}|${filtersKey(filters)}` };
  }

  // Never cached by the browser: an open page asks on focus whether anything was written since it last looked.
  router.get("/data-version", allow("watchDataVersion"), (_req, res) => {
    res.set("Cache-Control", "no-store").json({ version: dataVersion(db) });
  });

  router.get("/insight/options", allow("readInsightOptions"), (req, res) => {
    const viewer = viewerOf(db, signedInUser(req));
    sendCached(db, res, `options|${viewerKey(viewer)}`, () => filterOptions(db, viewer));
  });

  // the p-chart's limits: plain binomial, or widened by Laney's σ_z with `limits=laney`; `split=YYYY-MM-DD`
  // splits it into phases before and after that date
  router.get("/insight/overview", allow("readNetwork"), (req, res) => {
    const { limits, split } = parseWith(overviewChartQuerySchema, req.query, "The filters");
    const { viewer, filters, key } = context(req, `overview:${limits}:${split ?? ""}`);
    return sendAnswer(db, res, key, "overview", [viewer, filters, { limits, splitAt: split ?? null }]);
  });

  // comparisons between instructors: adjusted for case mix unless `adjust=none` asks for the crude view
  router.get("/insight/standing", allow("readOwnStanding"), (req, res) => {
    const { adjust } = parseWith(adjustQuerySchema, req.query, "The filters");
    const { viewer, filters, key } = context(req, `standing:${adjust}`);
    return sendAnswer(db, res, key, "standing", [viewer, filters, adjust]);
  });

  router.get("/insight/instructors", allow("drillDown"), (req, res) => {
    const { adjust } = parseWith(adjustQuerySchema, req.query, "The filters");
    const { filters, key } = context(req, `instructors:${adjust}`);
    return sendAnswer(db, res, key, "instructors", [filters, adjust]);
  });

  router.get("/insight/instructors/:id", allow("drillDown"), (req, res) => {
    const id = parseId(req.params.id);
    const { filters, key } = context(req, `instructor:${id}`);
    return sendAnswer(db, res, key, "instructor", [id, filters]);
  });

  router.get("/insight/errors", allow("drillDown"), (req, res) => {
    const { error, ...filterQuery } = parseWith(errorsQuerySchema, req.query, "The filters");
    const { filters, key } = context(req, `errors:${error ?? ""}`, filterQuery);
    return sendAnswer(db, res, key, "techniqueErrors", [filters, error]);
  });

  router.get("/classes/:id", allow("readAttempts"), (req, res) => {
    const id = parseWith(rowIdSchema, req.params.id, "The class id");
    res.json(classDetail(db, id, rowScope(signedInUser(req), "readAttempts").instructorId));
  });

  /** The network filters of an attempt search (the query's other fields are the search's own). */
  function filterPart(query: Record<string, unknown>) {
    return Object.fromEntries(Object.keys(insightFilterShape).map((key) => [key, query[key]]));
  }

  // Instructors see their own attempts only; others' are answered as missing, never as forbidden.
  router.get("/attempts", allow("readAttempts"), (req, res) => {
    const query = parseWith(attemptListQuerySchema, req.query, "The filters");
    const search = attemptSearchOf(query, rowScope(signedInUser(req), "readAttempts").instructorId);
    const page = { page: query.page, pageSize: query.pageSize };
    const { filters, key } = context(req, `attempts:${attemptSearchKey(search)}:${page.page}:${page.pageSize}`, filterPart(query));
    return sendAnswer(db, res, key, "attempts", [filters, search, page]);
  });

  // The whole result of the same search as CSV, with the same row scope.
  router.get("/attempts.csv", allow("readAttempts"), async (req, res) => {
    const query = parseWith(attemptExportQuerySchema, req.query, "The filters");
    const search = attemptSearchOf(query, rowScope(signedInUser(req), "readAttempts").instructorId);
    const { filters } = context(req, "attempts.csv", filterPart(query));
    res.status(200).attachment(attemptsCsvFileName(filters)).type("text/csv; charset=utf-8").set("Cache-Control", "no-store");
    try {
      await writeAttemptsCsv(db.$client.name, filters, search, {
        write: (text) => res.write(text),
        drained: () => drainedOrClosed(res),
        closed: () => res.destroyed,
      });
    } catch (err) {
      // the header is sent: a failure can only cut the download short, and the request log keeps the error
      res.err = err instanceof Error ? err : new Error(String(err));
      res.destroy();
      return;
    }
    res.end();
  });

  router.get("/attempts/:id", allow("readAttempts"), (req, res) => {
    const id = parseWith(rowIdSchema, req.params.id, "The attempt id");
    const user = signedInUser(req);
    res.json(attemptDetail(db, id, rowScope(user, "readAttempts").instructorId, viewerOf(db, user)));
  });

  return router;
}
