// "Send to funders": a stored version goes with the coordinator's cover note to every active funder account,
// plus any extra addresses, one message each. The form is checked in the browser with the server's own
// rules; then a confirmation step shows the exact PDF, the note, the period and every recipient, and only
// that step sends.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState, type FormEvent } from "react";
import { coverNoteSchema, type ReportSendRow, type ReportVersion } from "../../../shared/schemas/report";
import { Button } from "../../components/Button";
import { Field, Select, controlClass } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { errorMessage } from "../../components/States";
import { parseExtraAddresses } from "./extraAddresses";
import { periodLabel } from "../../../shared/period";
import { reportQueries, sendVersion } from "./queries";
import { SendConfirmation } from "./SendConfirmation";

export interface SendFormProps {
  period: string;
  versions: readonly ReportVersion[];
  /** Called after a send was recorded, sent or failed. */
  onSent?: (send: ReportSendRow) => void;
}

interface Review {
  version: ReportVersion;
  coverNote: string;
  extra: string[];
  recipients: string[];
}

export function SendForm({ period, versions, onSent }: SendFormProps) {
  const queryClient = useQueryClient();
  const funders = useQuery(reportQueries.funders());
  const latest = versions[0];
  const latestId = latest ? String(latest.id) : "";
  const [versionId, setVersionId] = useState(latestId);
  const [coverNote, setCoverNote] = useState("");
  const [coverError, setCoverError] = useState<string | undefined>(undefined);
  const [extra, setExtra] = useState("");
  const [extraError, setExtraError] = useState<string | null>(null);
  const [result, setResult] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const [review, setReview] = useState<Review | null>(null);
  const extraId = useId();
  const formId = useId();

  // A new version becomes the one to send.
  const [offeredLatestId, setOfferedLatestId] = useState(latestId);
  if (offeredLatestId !== latestId) {
    setOfferedLatestId(latestId);
    setVersionId(latestId);
  }

  const send = useMutation({
    mutationFn: ({ id, note, addresses }: { id: number; note: string; addresses: string[] }) => sendVersion(id, note, addresses),
    onSettled: () => queryClient.invalidateQueries({ queryKey: reportQueries.all() }),
  });

  function checkCoverNote(text: string): string | undefined {
    const checked = coverNoteSchema.safeParse(text);
    return checked.success ? undefined : checked.error.issues[0]?.message;
  }

  function toReview(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setResult(null);
    const noteError = checkCoverNote(coverNote);
    const parsed = parseExtraAddresses(extra);
    setCoverError(noteError);
    setExtraError(parsed.ok ? null : parsed.message);
    if (noteError) {
      document.getElementById(`${formId}-note`)?.querySelector("textarea")?.focus();
      return;
    }
    if (!parsed.ok) {
      document.getElementById(extraId)?.focus();
      return;
    }
    const version = versions.find((v) => String(v.id) === versionId);
    if (!version) {
      setResult({ tone: "error", text: "Choose the version to send." });
      return;
    }
    if (!funders.isSuccess) {
      setResult({ tone: "error", text: "The funder accounts are not loaded yet, so the recipients cannot be named. Try again in a moment." });
      return;
    }
    const recipients = [...new Set([...funders.data.map((a) => a.toLowerCase()), ...parsed.addresses])];
    if (recipients.length === 0) {
      setResult({ tone: "error", text: "There is nobody to send the report to: add extra addresses, or add a funder under Users." });
      return;
    }
    setReview({ version, coverNote: coverNoteSchema.parse(coverNote), extra: parsed.addresses, recipients });
  }

  function confirm() {
    if (!review) return;
    send.mutate(
      { id: review.version.id, note: review.coverNote, addresses: review.extra },
      {
        onSuccess: (row) => {
          onSent?.(row);
          setReview(null);
          if (row.status === "sent") {
            setExtra("");
            setCoverNote("");
            setResult({
              tone: "success",
              text: `Version ${row.version} of ${periodLabel(row.period)} was sent to ${row.recipients.join(", ")}, one message each.`,
            });
          } else {
            setResult({
              tone: "error",
              text: `Sending failed: ${row.error ?? "the mail server did not accept it"}. It is listed below; retry once the mail server is reachable.`,
            });
          }
        },
        onError: (error) => {
          setReview(null);
          setResult({ tone: "error", text: `Nothing was sent: ${errorMessage(error)}` });
        },
      },
    );
  }

  if (versions.length === 0) {
    return <p className="text-muted">Create a report version first: funders receive a stored version, never figures that can still change.</p>;
  }

  if (review) {
    return (
      <SendConfirmation
        version={review.version}
        coverNote={review.coverNote}
        recipients={review.recipients}
        busy={send.isPending}
        onConfirm={confirm}
        onBack={() => setReview(null)}
      />
    );
  }

  return (
    <form onSubmit={toReview} noValidate className="flex flex-col gap-4">
      <Select
        label={`Version of ${periodLabel(period)} to send`}
        className="max-w-sm"
        options={versions.map((v, i) => ({ value: String(v.id), label: `Version ${v.version}${i === 0 ? " (latest)" : ""}` }))}
        value={versionId}
        onChange={(event) => setVersionId(event.target.value)}
      />
      <div id={`${formId}-note`}>
        <Field
          label="Cover note"
          hint="Your words above the report in every message: why you send it and what is new. Up to 2000 characters."
          error={coverError}
        >
          {({ id, describedBy, invalid }) => (
            <textarea
              id={id}
              value={coverNote}
              onChange={(event) => {
                setCoverNote(event.target.value);
                if (coverError) setCoverError(checkCoverNote(event.target.value));
              }}
              rows={5}
              required
              aria-required="true"
              aria-invalid={invalid || undefined}
              aria-describedby={describedBy}
              className={`${controlClass(invalid)} max-w-3xl py-2`}
            />
          )}
        </Field>
      </div>
      <div className="text-small">
        <p className="font-semibold">Goes to every active funder account</p>
        {funders.isPending ? (
          <p className="text-muted">Loading the funder accounts…</p>
        ) : funders.isError ? (
          <p className="text-danger-text">The list of funder accounts could not be loaded ({errorMessage(funders.error)}); reload the page before sending.</p>
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
        <Button type="submit">Review before sending</Button>
      </div>
      {result && <Notice tone={result.tone}>{result.text}</Notice>}
    </form>
  );
}
