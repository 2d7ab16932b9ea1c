// The network policy in the settings pages: read it with its sources, list its versions, save a new version,
// and rescore attempts under the version in force.
import { Router } from "express";
import { POLICY_FIELD_SOURCES, rescoreSchema, savePolicySchema } from "../../shared/schemas/policySettings";
import { DEFAULT_POLICY, GUIDELINE_SOURCES, SAFETY_NOTE } from "../../shared/scoring/policy";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import { parseWith } from "../http/validate";
import { currentPolicy, listPolicyVersions, savePolicy } from "../policy/service";
import { rescoreAttempts } from "../scoring/rescore";

export function policyRoutes(db: Db): Router {
  const router = Router();

  router.get("/settings/policy", allow("readSettings"), (_req, res) => {
    res.json({
      current: currentPolicy(db),
      defaults: DEFAULT_POLICY,
      fieldSources: POLICY_FIELD_SOURCES,
      sources: GUIDELINE_SOURCES,
      safetyNote: SAFETY_NOTE,
    });
  });

  router.get("/settings/policy/versions", allow("readSettings"), (_req, res) => {
    res.json({ versions: listPolicyVersions(db) });
  });

  router.put("/settings/policy", allow("editSettings"), (req, res) => {
    const { policy, note } = parseWith(savePolicySchema, req.body, "The policy");
    res.json(savePolicy(db, policy, note, signedInUser(req).id));
  });

  router.post("/settings/rescore", allow("editSettings"), (req, res) => {
    const { fromQuarter } = parseWith(rescoreSchema, req.body ?? {}, "The rescore request");
    res.json(rescoreAttempts(db, fromQuarter));
  });

  return router;
}
