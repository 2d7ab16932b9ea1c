// `quarterbeat actions list`: every improvement action with its aim, scope, status, start, owner and the
// current verdict of its evaluation — the Improvement actions page's list, from the same services. The
// command line reads the whole database, so it lists every action with its full evaluation.
import type { Command } from "commander";
import { z } from "zod";
import { scopeLabel } from "../../shared/actionScope";
import { actionStatusNames, actionVerdictName, aimFigureName } from "../../shared/vocabulary";
import { withVerdicts } from "../../server/actions/actionList";
import { evaluateAction } from "../../server/actions/evaluation";
import { allActions } from "../../server/actions/service";
import { context } from "../context";

const optionsSchema = z.object({ json: z.boolean().optional() });

export function registerActions(program: Command) {
  const actions = program.command("actions").description("Improvement actions");
  actions
    .command("list")
    .description("Every improvement action with its aim, scope, status, start date, owner and evaluation")
    .option("--json", "print JSON")
    .action((raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      const { db } = context(command);
      const rows = withVerdicts(allActions(db), (action) => evaluateAction(db, action));
      const answer = rows.map((row) => ({
        id: row.id,
        title: row.title,
        aim: row.aim,
        target_pct: row.target,
        scope: { site: row.siteCode, instructor: row.instructorCode, profile: row.profile },
        status: row.status,
        start_date: row.startDate,
        owner: row.owner,
        verdict: row.verdict,
      }));
      if (options.json) return console.log(JSON.stringify(answer, null, 2));

      if (rows.length === 0) return console.log("No improvement actions yet. Record one on the Improvement actions page.");
      console.log(`${rows.length} improvement action${rows.length === 1 ? "" : "s"}, newest start first`);
      for (const row of rows) {
        console.log(`  #${row.id} ${row.title}`);
        console.log(
          `     ${aimFigureName(row.aim)} (target ${row.target} %) · ${scopeLabel(row)} · ${actionStatusNames[row.status]} · from ${row.startDate} · owner ${row.owner}`,
        );
        console.log(`     ${actionVerdictName(row.verdict)}`);
      }
    });
}
