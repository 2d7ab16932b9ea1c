// Scoring policy (coordinator edits, quality lead reads): the targets, the pass rule and the thresholds that
// every score and equipment check uses, each beside its default and where that default comes from; the list
// of saved versions; rescoring past attempts under the version in force.
import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import type { PolicySettingsAnswer } from "../../../shared/schemas/policySettings";
import { ApiError } from "../../api/http";
import { Notice } from "../../components/Notice";
import { PageHeader } from "../../components/PageHeader";
import { SafetyNote } from "../../components/SafetyNote";
import { ErrorState, LoadingState } from "../../components/States";
import { formatDateTime } from "../../lib/formatting";
import { useInsightOptions } from "../insight/useInsightFilters";
import { useCan } from "../auth/useCan";
import { useSavePolicy } from "./mutations";
import { PolicyForm, shortSourceName } from "./PolicyForm";
import { errorsByPath } from "./policyFields";
import { settingsQueries } from "./queries";
import { RescoreSection } from "./RescoreSection";
import { ChartBaselineSection } from "./ChartBaselineSection";
import { VersionList } from "./VersionList";
import { useLengthUnit } from "../../lib/useLengthUnit";

export default function SettingsPage() {
  const settings = useQuery(settingsQueries.policy());
  return (
    <div>
      <PageHeader
        title="Settings"
        description="The network's scoring policy: the targets each compression is judged against, the rule that decides whether an attempt passes, and the equipment thresholds. Every saved change is a new version; stored scores name the version that made them."
      />
      {settings.isPending ? (
        <LoadingState label="Loading the policy…" />
      ) : settings.isError ? (
        <ErrorState error={settings.error} onRetry={() => settings.refetch()} />
      ) : (
        <Settings answer={settings.data} />
      )}
    </div>
  );
}

function Settings({ answer }: { answer: PolicySettingsAnswer }) {
  const canEdit = useCan("editSettings");
  const { unit } = useLengthUnit();
  const versions = useQuery(settingsQueries.versions());
  const options = useInsightOptions();
  const save = useSavePolicy();
  const [saved, setSaved] = useState<number | null>(null);
  const serverErrors =
    save.error instanceof ApiError
      ? serverFieldErrors(save.error)
      : save.error
        ? { form: "The policy could not be saved. Check the connection and try again." }
        : {};
  const { current } = answer;

  return (
    <div className="flex flex-col gap-6">
      <SafetyNote />
      <div className="flex flex-col gap-1 rounded-card border border-dusk-200 bg-dusk-50 p-4 text-small">
        <p>
          <strong>In force: version {current.version}</strong>, saved {formatDateTime(current.createdAt)}
          {current.note ? ` — “${current.note}”` : ""}.
        </p>
        <p className="text-muted">
          {canEdit
            ? "Beside each field: its default and where that default comes from. Guideline values come from the published guidelines listed at the foot of the page; project defaults are Quarterbeat’s and the network may change them."
            : "You can read the policy; only the regional coordinator can change it or rescore attempts."}
        </p>
      </div>
      {saved !== null && (
        <Notice tone="success">Saved as version {saved}. New imports are scored under it; stored scores keep their version until you rescore below.</Notice>
      )}
      <PolicyForm
        key={`${current.version}|${unit}`}
        current={current}
        defaults={answer.defaults}
        fieldSources={answer.fieldSources}
        unit={unit}
        canEdit={canEdit}
        saving={save.isPending}
        serverErrors={serverErrors}
        onSave={(policy, note) => {
          setSaved(null);
          save.mutate({ policy, note }, { onSuccess: (version) => setSaved(version.version) });
        }}
      />

      <RescoreSection version={current.version} quarters={options.data ? [...options.data.quarters].reverse() : []} canEdit={canEdit} />

      <ChartBaselineSection quarters={options.data ? [...options.data.quarters].reverse() : []} canEdit={canEdit} />

      <section aria-labelledby="versions-heading" className="flex flex-col gap-3">
        <h2 id="versions-heading" className="text-title">
          Versions
        </h2>
        {versions.isPending ? (
          <LoadingState label="Loading the versions…" />
        ) : versions.isError ? (
          <ErrorState error={versions.error} onRetry={() => versions.refetch()} />
        ) : (
          <VersionList versions={versions.data} unit={unit} inForce={current.version} />
        )}
      </section>

      <section aria-labelledby="sources-heading" className="flex flex-col gap-2 text-small">
        <h2 id="sources-heading" className="text-title">
          Sources
        </h2>
        <ul className="flex flex-col gap-2">
          {answer.sources.map((source) => (
            <li key={source.id}>
              <strong>{shortSourceName(source.id)}</strong>: {source.citation}
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}

/** The server's 422 details name fields as "policy.bands.adult.depthMaxMm"; the form names them without "policy.". */
function serverFieldErrors(error: ApiError): Record<string, string> {
  const details = Array.isArray(error.details) ? (error.details as { path?: unknown; message?: unknown }[]) : [];
  const issues = details
    .filter((d) => typeof d.message === "string")
    .map((d) => ({ path: (typeof d.path === "string" ? d.path.replace(/^policy\./, "").split(".") : []).filter(Boolean), message: d.message as string }));
  const errors = errorsByPath(issues);
  if (!errors.form && Object.keys(errors).length === 0) errors.form = error.message;
  return errors;
}
