// Scoring past attempts again under the version in force, after a confirmation that says what happens: the
// old scores stay in each attempt's history and every score names the version that made it.
import { formatCount } from "../../lib/formatting";
import { useState } from "react";
import type { RescoreAnswer } from "../../../shared/schemas/policySettings";
import { Button } from "../../components/Button";
import { Dialog } from "../../components/Dialog";
import { Select } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { errorMessage } from "../../components/States";
import { useRescore } from "./mutations";
import { quarterLabel } from "../../../shared/period";

export function RescoreSection({ version, quarters, canEdit }: { version: number; quarters: readonly string[]; canEdit: boolean }) {
  const [open, setOpen] = useState(false);
  const [fromQuarter, setFromQuarter] = useState("");
  const [result, setResult] = useState<RescoreAnswer | null>(null);
  const rescore = useRescore();

  function confirm() {
    rescore.mutate(fromQuarter ? { fromQuarter } : {}, {
      onSuccess: (answer) => {
        setResult(answer);
        setOpen(false);
      },
    });
  }

  return (
    <section aria-labelledby="rescore-heading" className="flex flex-col gap-3 rounded-card border border-line bg-surface p-4 shadow-card">
      <h2 id="rescore-heading" className="text-title">
        Rescore past attempts
      </h2>
      <p className="max-w-3xl">
        Attempts keep the score of the policy version in force when they were imported. Rescoring applies the pass rule of version {version} to every attempt
        scored under an older version; target bands and the pause threshold affect attempts imported from now on.
      </p>
      {result && (
        <Notice tone="success">
          Rescored under version {result.version}: {formatCount(result.examined)} attempts examined, {formatCount(result.changed)} changed score, result or
          errors. Their earlier scores are in each attempt’s history.
        </Notice>
      )}
      {canEdit ? (
        <Button
          variant="secondary"
          className="self-start"
          onClick={() => {
            rescore.reset();
            setOpen(true);
          }}
        >
          Rescore past attempts under version {version}…
        </Button>
      ) : (
        <p className="text-small text-muted">Only the regional coordinator can rescore.</p>
      )}
      <Dialog open={open} title={`Rescore under version ${version}?`} onClose={() => setOpen(false)}>
        <div className="flex flex-col gap-3">
          <p>Every attempt scored under an older policy version gets its score, result and errors worked out again under version {version}.</p>
          <ul className="list-disc pl-5 text-small">
            <li>Where anything changes, the old score, result and errors are kept in the attempt’s score history.</li>
            <li>Every score shows the policy version that made it.</li>
            <li>Pass rates and error counts on every page follow the new scores.</li>
          </ul>
          <p className="text-small text-muted">
            Rescoring applies the pass rule to the figures stored with each attempt (shares on target, hands-on time, longest pause). Those figures were
            measured against the target bands and the pause threshold in force when the attempt was imported; changed bands apply to attempts imported from now
            on.
          </p>
          <Select
            label="Attempts from"
            value={fromQuarter}
            onChange={(event) => setFromQuarter(event.target.value)}
            placeholder="Every quarter"
            options={quarters.map((q) => ({ value: q, label: `${quarterLabel(q)} on` }))}
          />
          {rescore.isError && <Notice tone="error">{errorMessage(rescore.error)}</Notice>}
          <div className="flex flex-wrap justify-end gap-2">
            <Button variant="secondary" onClick={() => setOpen(false)} disabled={rescore.isPending}>
              Cancel
            </Button>
            <Button onClick={confirm} busy={rescore.isPending}>
              Rescore
            </Button>
          </div>
        </div>
      </Dialog>
    </section>
  );
}
