// System (coordinator): the installation's state in one place: program and schema, database size and growth,
// backups with their verification, the last imports and mail. `quarterbeat system` prints the same answer.
import { useQuery } from "@tanstack/react-query";
import { Button } from "../../components/Button";
import { Notice } from "../../components/Notice";
import { PageHeader } from "../../components/PageHeader";
import { ErrorState, LoadingState } from "../../components/States";
import { BackupsSection } from "./BackupsSection";
import { DatabaseSection } from "./DatabaseSection";
import { ImportsSection } from "./ImportsSection";
import { MailSection } from "./MailSection";
import { systemQueries } from "./queries";

export default function SystemPage() {
  const report = useQuery(systemQueries.report());
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        title="System"
        description="How this installation is doing: its version and database, the backups and whether they were verified, the last imports and the mail sent."
        actions={
          <Button variant="secondary" onClick={() => report.refetch()} busy={report.isFetching && !report.isPending}>
            Refresh
          </Button>
        }
      />
      {report.isPending ? (
        <LoadingState label="Loading the system state…" />
      ) : report.isError ? (
        <ErrorState error={report.error} title="The system state could not be loaded" onRetry={() => report.refetch()} />
      ) : (
        <>
          {!report.data.migration.current && (
            <Notice tone="error">The database lacks migrations this version ships: restart the server, which applies them.</Notice>
          )}
          <DatabaseSection report={report.data} />
          <BackupsSection backups={report.data.backups} />
          <ImportsSection imports={report.data.imports} />
          <MailSection mail={report.data.mail} />
        </>
      )}
    </div>
  );
}
