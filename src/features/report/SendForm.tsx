// "Send to funders": a stored version goes to every active funder account, plus any extra addresses. The
// addresses are checked in the browser with the server's own rule before anything is sent.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState, type FormEvent } from "react";
import type { ReportSendRow, ReportVersion } from "../../../shared/schemas/report";
import { Button } from "../../components/Button";
import { Select, controlClass } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { errorMessage } from "../../components/States";
import { parseExtraAddresses } from "./extraAddresses";
import { periodLabel } from "../../../shared/period";
import { reportQueries, sendVersion } from "./queries";

export interface SendFormProps {
  period: string;
  versions: readonly ReportVersion[];
  /** Called after a send was recorded, sent or failed. */
  onSent?: (send: ReportSendRow) => void;
}

export function SendForm({ period, versions, onSent }: SendFormProps) {
  const queryClient = useQueryClient();
  const funders = useQuery(reportQueries.funders());
  const latest = versions[0];
  const latestId = latest ? String(latest.id) : "";
  const [versionId, setVersionId] = useState(latestId);
  const [extra, setExtra] = useState("");
  const [extraError, setExtraError] = useState<string | null>(null);
  const [result, setResult] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const extraId = useId();

  // A new version becomes the one to send.
  const [offeredLatestId, setOfferedLatestId] = useState(latestId);
  if (offeredLatestId !== latestId) {
    setOfferedLatestId(latestId);
    setVersionId(latestId);
  }

  const send = useMutation({
    mutationFn: ({ id, addresses }: { id: number; addresses: string[] }) => sendVersion(id, addresses),
    onSettled: () => queryClient.invalidateQueries({ queryKey: reportQueries.all() }),
  });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setResult(null);
    const parsed = parseExtraAddresses(extra);
    if (!parsed.ok) {
      setExtraError(parsed.message);
      document.getElementById(extraId)?.focus();
      return;
    }
    setExtraError(null);
    const version = versions.find((v) => String(v.id) === versionId);
    if (!version) {
      setResult({ tone: "error", text: "Choose the version to send." });
      return;
    }
    send.mutate(
      { id: version.id, addresses: parsed.addresses },
      {
        onSuccess: (row) => {
          onSent?.(row);
          if (row.status === "sent") {
            setExtra("");
            setResult({ tone: "success", text: `Version ${row.version} of ${periodLabel(row.period)} was sent to ${row.recipients.join(", ")}.` });
          } else {
            setResult({ tone: "error", text: `Sending failed: ${row.error ?? "the mail server did not accept it"}. It is listed below; retry once the mail server is reachable.` });
          }
        },
        onError: (error) => setResult({ tone: "error", text: `Nothing was sent: ${errorMessage(error)}` }),
      },
    );
  }

  if (versions.length === 0) {
    return <p className="text-muted">Create a report version first: funders receive a stored version, never figures that can still change.</p>;
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <Select
        label={`Version of ${periodLabel(period)} to send`}
        className="max-w-sm"
        options={versions.map((v, i) => ({ value: String(v.id), label: `Version ${v.version}${i === 0 ? " (latest)" : ""}` }))}
        value={versionId}
        onChange={(event) => setVersionId(event.target.value)}
      />
      <div className="text-small">
        <p className="font-semibold">Goes to every active funder account</p>
        {funders.isPending ? (
          <p className="text-muted">Loading the funder accounts…</p>
        ) : funders.isError ? (
          <p className="text-muted">The list of funder accounts could not be loaded ({errorMessage(funders.error)}); the server still sends to all of them.</p>
        ) : funders.data.length === 0 ? (
          <p className="text-danger-text">There is no active funder account. Add extra addresses below, or add a funder under Users.</p>
        ) : (
          <p className="break-words text-muted">{funders.data.join(", ")}</p>
        )}
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={extraId} className="text-small font-semibold">
          Extra addresses <span className="font-normal text-muted">(optional)</span>
        </label>
        <p id={`${extraId}-hint`} className="text-caption text-muted">
          For people without a Quarterbeat account, such as a board member. Separate addresses with commas or new lines; up to 20.
        </p>
        <textarea
          id={extraId}
          value={extra}
          onChange={(event) => {
            setExtra(event.target.value);
            if (extraError) {
              const parsed = parseExtraAddresses(event.target.value);
              setExtraError(parsed.ok ? null : parsed.message);
            }
          }}
          rows={2}
          aria-invalid={extraError ? true : undefined}
          aria-describedby={`${extraError ? `${extraId}-error ` : ""}${extraId}-hint`}
          className={`${controlClass(Boolean(extraError))} max-w-xl py-2`}
          autoComplete="off"
          spellCheck={false}
        />
        {extraError && (
          <p id={`${extraId}-error`} className="text-small font-medium text-danger-text">
            {extraError}
          </p>
        )}
      </div>
      <div>
        <Button type="submit" busy={send.isPending}>
          Send to funders
        </Button>
      </div>
      {result && <Notice tone={result.tone}>{result.text}</Notice>}
    </form>
  );
}
