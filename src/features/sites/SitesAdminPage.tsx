// Sites and instructors (coordinator): the places of the network and the people who teach there.
import { useQuery } from "@tanstack/react-query";
import { useMemo, useState } from "react";
import type { InstructorRow, SiteRow } from "../../../shared/schemas/sites";
import { ActiveBadge } from "../../components/ActiveBadge";
import { Button } from "../../components/Button";
import { DataTable, type Column } from "../../components/DataTable";
import { Dialog } from "../../components/Dialog";
import { Notice } from "../../components/Notice";
import { PageHeader } from "../../components/PageHeader";
import { ErrorState, LoadingState, errorMessage } from "../../components/States";
import { AddInstructorForm, ChangeSiteForm } from "../instructors/InstructorForms";
import { useUpdateInstructor } from "../instructors/mutations";
import { instructorQueries } from "../instructors/queries";
import { AddSiteForm, RenameSiteForm } from "./SiteForms";
import { useUpdateSite } from "./mutations";
import { siteQueries } from "./queries";

type OpenDialog = { kind: "addSite" } | { kind: "rename"; site: SiteRow } | { kind: "addInstructor" } | { kind: "move"; instructor: InstructorRow } | null;
type Message = { tone: "success" | "error"; text: string } | null;

export default function SitesAdminPage() {
  const [dialog, setDialog] = useState<OpenDialog>(null);
  const [message, setMessage] = useState<Message>(null);
  const close = () => setDialog(null);
  const done = (text: string) => {
    close();
    setMessage({ tone: "success", text });
  };

  return (
    <div>
      <PageHeader
        title="Sites and instructors"
        description="The training sites of the network and the instructors who teach at them. Codes match the ones in import files."
      />
      {message && (
        <Notice tone={message.tone} className="mb-4">
          {message.text}
        </Notice>
      )}
      <SitesSection onOpen={setDialog} onMessage={setMessage} />
      <InstructorsSection onOpen={setDialog} onMessage={setMessage} />

      <Dialog open={dialog?.kind === "addSite"} title="Add site" onClose={close}>
        <AddSiteForm onCancel={close} onDone={(site) => done(`Site ${site.code} · ${site.name} added.`)} />
      </Dialog>
      <Dialog open={dialog?.kind === "rename"} title="Rename site" onClose={close}>
        {dialog?.kind === "rename" && (
          <RenameSiteForm site={dialog.site} onCancel={close} onDone={(site) => done(`Site ${site.code} is now called ${site.name}.`)} />
        )}
      </Dialog>
      <Dialog open={dialog?.kind === "addInstructor"} title="Add instructor" onClose={close}>
        <AddInstructorForm onCancel={close} onDone={(instructor) => done(`Instructor ${instructor.code} · ${instructor.name} added.`)} />
      </Dialog>
      <Dialog open={dialog?.kind === "move"} title="Change site" onClose={close}>
        {dialog?.kind === "move" && (
          <ChangeSiteForm
            instructor={dialog.instructor}
            onCancel={close}
            onDone={(instructor) => done(`${instructor.name} is now at ${instructor.siteCode ?? "no site"}.`)}
          />
        )}
      </Dialog>
    </div>
  );
}

interface SectionProps {
  onOpen: (dialog: OpenDialog) => void;
  onMessage: (message: Message) => void;
}

function SectionHeading({ id, title, action }: { id: string; title: string; action: React.ReactNode }) {
  return (
    <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
      <h2 id={id} className="text-title">
        {title}
      </h2>
      {action}
    </div>
  );
}

function SitesSection({ onOpen, onMessage }: SectionProps) {
  const sites = useQuery(siteQueries.list());
  const update = useUpdateSite();

  const columns = useMemo<Column<SiteRow>[]>(() => {
    const setActive = (site: SiteRow, active: boolean) => {
      onMessage(null);
      update.mutate(
        { id: site.id, changes: { active } },
        {
          onSuccess: () =>
            onMessage({
              tone: "success",
              text: active ? `Site ${site.code} is active again.` : `Site ${site.code} is deactivated.`,
            }),
          onError: (error) => onMessage({ tone: "error", text: `Site ${site.code} was not changed: ${errorMessage(error)}` }),
        },
      );
    };
    return [
      { key: "code", header: "Code", value: (s) => s.code, render: (s) => <span className="font-mono text-small">{s.code}</span> },
      { key: "name", header: "Name", value: (s) => s.name, render: (s) => <span className="font-medium">{s.name}</span>, primary: true },
      { key: "instructors", header: "Instructors", value: (s) => s.instructors, align: "right" },
      { key: "manikins", header: "Manikins", value: (s) => s.manikins, align: "right" },
      { key: "active", header: "Status", value: (s) => (s.active ? "Active" : "Deactivated"), render: (s) => <ActiveBadge active={s.active} /> },
      {
        key: "actions",
        header: "Actions",
        sortable: false,
        exportable: false,
        value: () => "",
        render: (s) => (
          <div className="-mx-2.5 flex gap-0.5">
            <Button size="sm" variant="quiet" onClick={() => onOpen({ kind: "rename", site: s })}>
              Rename<span className="sr-only"> {s.name}</span>
            </Button>
            <Button
              size="sm"
              variant={s.active ? "dangerQuiet" : "quiet"}
              disabled={update.isPending && update.variables?.id === s.id}
              onClick={() => setActive(s, !s.active)}
            >
              {s.active ? "Deactivate" : "Reactivate"}
              <span className="sr-only"> {s.name}</span>
            </Button>
          </div>
        ),
      },
    ];
  }, [onOpen, onMessage, update]);

  return (
    <section aria-labelledby="sites-heading" className="mb-10">
      <SectionHeading id="sites-heading" title="Sites" action={<Button onClick={() => onOpen({ kind: "addSite" })}>Add site</Button>} />
      {sites.isPending ? (
        <LoadingState label="Loading sites…" />
      ) : sites.isError ? (
        <ErrorState error={sites.error} title="The site list could not be loaded" onRetry={() => sites.refetch()} />
      ) : (
        <DataTable
          caption="Sites"
          captionHidden
          columns={columns}
          rows={sites.data}
          rowKey={(s) => s.id}
          initialSort={{ key: "code", direction: "asc" }}
          exportFileName="quarterbeat-sites"
          emptyMessage="No sites yet. Add the first one with “Add site”."
        />
      )}
    </section>
  );
}

function InstructorsSection({ onOpen, onMessage }: SectionProps) {
  const instructors = useQuery(instructorQueries.list());
  const sites = useQuery(siteQueries.list());
  const update = useUpdateInstructor();
  const siteNames = useMemo(() => new Map((sites.data ?? []).map((s) => [s.id, s.name])), [sites.data]);

  const columns = useMemo<Column<InstructorRow>[]>(() => {
    const setActive = (instructor: InstructorRow, active: boolean) => {
      onMessage(null);
      update.mutate(
        { id: instructor.id, changes: { active } },
        {
          onSuccess: () => onMessage({ tone: "success", text: active ? `${instructor.name} is active again.` : `${instructor.name} is deactivated.` }),
          onError: (error) => onMessage({ tone: "error", text: `${instructor.name} was not changed: ${errorMessage(error)}` }),
        },
      );
    };
    return [
      { key: "code", header: "Code", value: (i) => i.code, render: (i) => <span className="font-mono text-small">{i.code}</span> },
      { key: "name", header: "Name", value: (i) => i.name, render: (i) => <span className="font-medium">{i.name}</span>, primary: true },
      {
        key: "site",
        header: "Site",
        value: (i) => (i.siteId === null ? "" : `${i.siteCode ?? ""} ${siteNames.get(i.siteId) ?? ""}`.trim()),
        render: (i) =>
          i.siteId === null ? (
            <span className="text-muted">No site</span>
          ) : (
            <span>
              <span className="font-mono text-small">{i.siteCode}</span>
              {siteNames.get(i.siteId) && <span className="text-muted"> · {siteNames.get(i.siteId)}</span>}
            </span>
          ),
      },
      { key: "active", header: "Status", value: (i) => (i.active ? "Active" : "Deactivated"), render: (i) => <ActiveBadge active={i.active} /> },
      {
        key: "actions",
        header: "Actions",
        sortable: false,
        exportable: false,
        value: () => "",
        render: (i) => (
          <div className="-mx-2.5 flex gap-0.5">
            <Button size="sm" variant="quiet" onClick={() => onOpen({ kind: "move", instructor: i })}>
              Change site<span className="sr-only"> for {i.name}</span>
            </Button>
            <Button
              size="sm"
              variant={i.active ? "dangerQuiet" : "quiet"}
              disabled={update.isPending && update.variables?.id === i.id}
              onClick={() => setActive(i, !i.active)}
            >
              {i.active ? "Deactivate" : "Reactivate"}
              <span className="sr-only"> {i.name}</span>
            </Button>
          </div>
        ),
      },
    ];
  }, [onOpen, onMessage, update, siteNames]);

  return (
    <section aria-labelledby="instructors-heading">
      <SectionHeading id="instructors-heading" title="Instructors" action={<Button onClick={() => onOpen({ kind: "addInstructor" })}>Add instructor</Button>} />
      {instructors.isPending ? (
        <LoadingState label="Loading instructors…" />
      ) : instructors.isError ? (
        <ErrorState error={instructors.error} title="The instructor list could not be loaded" onRetry={() => instructors.refetch()} />
      ) : (
        <DataTable
          caption="Instructors"
          captionHidden
          columns={columns}
          rows={instructors.data}
          rowKey={(i) => i.id}
          initialSort={{ key: "code", direction: "asc" }}
          exportFileName="quarterbeat-instructors"
          emptyMessage="No instructors yet. Add one with “Add instructor”."
        />
      )}
    </section>
  );
}
