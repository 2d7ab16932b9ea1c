// Users (coordinator): every account, adding one, editing, deactivating and setting temporary passwords.
import { formatDay } from "../../lib/formatting";
import { useQuery } from "@tanstack/react-query";
import { useCallback, useMemo, useState } from "react";
import { roleLabels } from "../../../shared/domain";
import type { UserRow } from "../../../shared/schemas/users";
import { ActiveBadge } from "../../components/ActiveBadge";
import { Button } from "../../components/Button";
import { DataTable, type Column } from "../../components/DataTable";
import { Dialog } from "../../components/Dialog";
import { Notice } from "../../components/Notice";
import { PageHeader } from "../../components/PageHeader";
import { ErrorState, LoadingState, errorMessage } from "../../components/States";
import { useCurrentUser } from "../auth/useSession";
import { useUpdateUser } from "./mutations";
import { userQueries } from "./queries";
import { AddUserForm, EditUserForm, ResetPasswordForm } from "./UserForms";

type OpenDialog = { kind: "add" } | { kind: "edit"; user: UserRow } | { kind: "password"; user: UserRow } | null;
type Message = { tone: "success" | "error"; text: string } | null;

export default function UsersAdminPage() {
  const me = useCurrentUser();
  const users = useQuery(userQueries.list());
  const update = useUpdateUser();
  const [dialog, setDialog] = useState<OpenDialog>(null);
  const [message, setMessage] = useState<Message>(null);

  const { mutate: saveUser } = update;
  const setActive = useCallback(
    (user: UserRow, active: boolean) => {
      setMessage(null);
      saveUser(
        { id: user.id, changes: { active } },
        {
          onSuccess: () =>
            setMessage({
              tone: "success",
              text: active ? `${user.displayName} can sign in again.` : `${user.displayName} is deactivated and can no longer sign in.`,
            }),
          onError: (error) => setMessage({ tone: "error", text: `${user.displayName} was not changed: ${errorMessage(error)}` }),
        },
      );
    },
    [saveUser],
  );

  const columns = useMemo<Column<UserRow>[]>(
    () => [
      {
        key: "name",
        header: "Name",
        value: (u) => u.displayName,
        render: (u) => (
          <span className="font-medium">
            {u.displayName}
            {u.id === me.id && <span className="font-normal text-muted"> (you)</span>}
          </span>
        ),
      },
      { key: "email", header: "E-mail", value: (u) => u.email, render: (u) => <EmailAddress email={u.email} />, wrap: true },
      { key: "role", header: "Role", value: (u) => roleLabels[u.role], wrap: true },
      {
        key: "instructor",
        header: "Instructor",
        value: (u) => u.instructorCode ?? "",
        render: (u) => u.instructorCode ?? <span className="text-muted">—</span>,
      },
      { key: "active", header: "Status", value: (u) => (u.active ? "Active" : "Deactivated"), render: (u) => <ActiveBadge active={u.active} /> },
      {
        key: "created",
        header: "Added",
        value: (u) => u.createdAt.slice(0, 10),
        render: (u) => formatDay(u.createdAt),
        sortLabels: { asc: "oldest first", desc: "newest first" },
      },
      {
        key: "actions",
        header: "Actions",
        sortable: false,
        exportable: false,
        value: () => "",
        render: (u) => (
          <div className="-mx-2.5 flex gap-0.5">
            <Button size="sm" variant="quiet" onClick={() => setDialog({ kind: "edit", user: u })}>
              Edit<span className="sr-only"> {u.displayName}</span>
            </Button>
            <Button size="sm" variant="quiet" onClick={() => setDialog({ kind: "password", user: u })}>
              Set password<span className="sr-only"> for {u.displayName}</span>
            </Button>
            {u.id === me.id ? null : u.active ? (
              <Button size="sm" variant="dangerQuiet" disabled={update.isPending && update.variables?.id === u.id} onClick={() => setActive(u, false)}>
                Deactivate<span className="sr-only"> {u.displayName}</span>
              </Button>
            ) : (
              <Button size="sm" variant="quiet" disabled={update.isPending && update.variables?.id === u.id} onClick={() => setActive(u, true)}>
                Reactivate<span className="sr-only"> {u.displayName}</span>
              </Button>
            )}
          </div>
        ),
      },
    ],
    [me.id, update.isPending, update.variables, setActive],
  );

  const close = () => setDialog(null);

  return (
    <div>
      <PageHeader
        title="Users"
        description="Everyone who can sign in to Quarterbeat, and what their role lets them see."
        actions={<Button onClick={() => setDialog({ kind: "add" })}>Add user</Button>}
      />
      {message && (
        <Notice tone={message.tone} className="mb-4">
          {message.text}
        </Notice>
      )}
      {users.isPending ? (
        <LoadingState label="Loading users…" />
      ) : users.isError ? (
        <ErrorState error={users.error} title="The user list could not be loaded" onRetry={() => users.refetch()} />
      ) : (
        <DataTable
          caption="Users"
          captionHidden
          columns={columns}
          rows={users.data}
          rowKey={(u) => u.id}
          initialSort={{ key: "name", direction: "asc" }}
          exportFileName="quarterbeat-users"
          emptyMessage="No users yet. Add the first one with “Add user”."
        />
      )}

      <Dialog open={dialog?.kind === "add"} title="Add user" onClose={close}>
        <AddUserForm
          onCancel={close}
          onDone={(user) => {
            close();
            setMessage({ tone: "success", text: `${user.displayName} added as ${roleLabels[user.role].toLowerCase()}. Give them their initial password.` });
          }}
        />
      </Dialog>
      <Dialog open={dialog?.kind === "edit"} title={dialog?.kind === "edit" ? `Edit ${dialog.user.displayName}` : "Edit user"} onClose={close}>
        {dialog?.kind === "edit" && (
          <EditUserForm
            user={dialog.user}
            isSelf={dialog.user.id === me.id}
            onCancel={close}
            onDone={(user) => {
              close();
              setMessage({ tone: "success", text: `Saved changes to ${user.displayName}.` });
            }}
          />
        )}
      </Dialog>
      <Dialog open={dialog?.kind === "password"} title="Set a temporary password" onClose={close}>
        {dialog?.kind === "password" && (
          <ResetPasswordForm
            user={dialog.user}
            onCancel={close}
            onDone={() => {
              close();
              setMessage({ tone: "success", text: `New temporary password set for ${dialog.user.displayName}.` });
            }}
          />
        )}
      </Dialog>
    </div>
  );
}

/** Long addresses may break after the "@" and nowhere else, so the table keeps its actions in view. */
function EmailAddress({ email }: { email: string }) {
  const at = email.indexOf("@");
  if (at < 0) return <>{email}</>;
  return (
    <>
      <span className="whitespace-nowrap">{email.slice(0, at + 1)}</span>
      <wbr />
      <span className="whitespace-nowrap">{email.slice(at + 1)}</span>
    </>
  );
}
