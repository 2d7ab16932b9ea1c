// The forms of the users page: add an account, edit one, set a temporary password. Each validates with the
// shared schema the server uses and shows the server's own messages beside the fields too.
import { useQuery } from "@tanstack/react-query";
import { useFormContext, useWatch } from "react-hook-form";
import { roleLabels, userRoles, type UserRole } from "../../../shared/domain";
import { newUserSchema, resetPasswordSchema, updateUserSchema, type NewUser, type UpdateUser, type UserRow } from "../../../shared/schemas/users";
import { FormField } from "../../components/FormField";
import { FormActions, FormShell } from "../../components/FormShell";
import { showServerError, useSchemaForm } from "../../lib/useSchemaForm";
import { instructorOptions } from "../instructors/options";
import { instructorQueries } from "../instructors/queries";
import { useCreateUser, useResetUserPassword, useUpdateUser } from "./mutations";

const roleOptions = userRoles.map((role) => ({ value: role, label: roleLabels[role] }));

export const roleHints: Record<UserRole, string> = {
  coordinator: "Runs the network: all data, users, sites and settings.",
  quality_lead: "Reviews quality across the network; no account administration.",
  instructor: "Sees their own classes and standing; must be linked to an instructor record.",
  funder: "Sees network summaries only.",
};

interface RoleValues {
  role: UserRole | "";
  instructorId: number | null;
}

/** The role, and the linked instructor that only the instructor role has (cleared in the same change). */
function RoleFields({ placeholder, lockedHint }: { placeholder?: string; lockedHint?: string }) {
  const { setValue } = useFormContext<RoleValues>();
  const role = useWatch<RoleValues, "role">({ name: "role" });
  return (
    <>
      <FormField
        label="Role"
        name="role"
        placeholder={placeholder}
        options={roleOptions}
        disabled={lockedHint !== undefined}
        hint={lockedHint ?? (role ? roleHints[role] : undefined)}
        onChosen={(next) => {
          if (next !== "instructor") setValue("instructorId", null, { shouldValidate: true });
        }}
      />
      {role === "instructor" && <InstructorField />}
    </>
  );
}

function InstructorField() {
  const instructors = useQuery(instructorQueries.list());
  const linked = useWatch<RoleValues, "instructorId">({ name: "instructorId" });
  return (
    <FormField
      label="Linked instructor"
      name="instructorId"
      numeric
      hint={instructors.isError ? "The instructor list could not be loaded." : "The instructor record whose classes this account sees."}
      placeholder={instructors.isPending ? "Loading instructors…" : "Choose an instructor…"}
      options={instructorOptions(instructors.data ?? [], linked)}
    />
  );
}

interface NewUserValues extends RoleValues {
  email: string;
  displayName: string;
  password: string;
}

export function AddUserForm({ onDone, onCancel }: { onDone: (user: UserRow) => void; onCancel: () => void }) {
  const create = useCreateUser();
  const form = useSchemaForm<NewUser, NewUserValues>(newUserSchema, { email: "", displayName: "", role: "", instructorId: null, password: "" });
  const submit = (user: NewUser) =>
    create.mutate(user, { onSuccess: ({ user: created }) => onDone(created), onError: (error) => showServerError(form, error) });

  return (
    <FormShell form={form} onValid={submit}>
      <FormField label="E-mail address" name="email" type="email" autoComplete="off" spellCheck={false} />
      <FormField label="Display name" name="displayName" autoComplete="off" hint="How the person appears in Quarterbeat." />
      <RoleFields placeholder="Choose a role…" />
      <FormField
        label="Initial password"
        name="password"
        type="text"
        autoComplete="off"
        spellCheck={false}
        hint="At least 10 characters. Give it to the person by a separate channel; they change it under My account."
      />
      <FormActions submitLabel="Add user" busy={create.isPending} onCancel={onCancel} />
    </FormShell>
  );
}

// The link rule of new accounts applies to edits as well.
const editUserSchema = updateUserSchema.refine((u) => u.role !== "instructor" || (u.instructorId ?? null) !== null, {
  message: "An instructor account must be linked to an instructor",
  path: ["instructorId"],
});

export function EditUserForm({ user, isSelf, onDone, onCancel }: { user: UserRow; isSelf: boolean; onDone: (user: UserRow) => void; onCancel: () => void }) {
  const update = useUpdateUser();
  const form = useSchemaForm<UpdateUser, RoleValues & { displayName: string }>(editUserSchema, {
    displayName: user.displayName,
    role: user.role,
    instructorId: user.instructorId,
  });
  const submit = (values: UpdateUser) => {
    // Send only what changed, so an unchanged role is never re-submitted.
    const changes = Object.fromEntries(Object.entries(values).filter(([key, value]) => value !== undefined && value !== user[key as keyof UserRow]));
    if (Object.keys(changes).length === 0) return onDone(user);
    update.mutate({ id: user.id, changes }, { onSuccess: ({ user: saved }) => onDone(saved), onError: (error) => showServerError(form, error) });
  };

  return (
    <FormShell
      form={form}
      onValid={submit}
      lead={
        <p className="text-small text-muted">
          E-mail: <span className="font-medium text-ink">{user.email}</span>
        </p>
      }
    >
      <FormField label="Display name" name="displayName" />
      <RoleFields lockedHint={isSelf ? "You cannot change your own role; another coordinator can." : undefined} />
      <FormActions submitLabel="Save changes" busy={update.isPending} onCancel={onCancel} />
    </FormShell>
  );
}

export function ResetPasswordForm({ user, onDone, onCancel }: { user: UserRow; onDone: () => void; onCancel: () => void }) {
  const reset = useResetUserPassword();
  const form = useSchemaForm(resetPasswordSchema, { password: "" });
  const submit = ({ password }: { password: string }) =>
    reset.mutate({ id: user.id, password }, { onSuccess: onDone, onError: (error) => showServerError(form, error) });
  return (
    <FormShell
      form={form}
      onValid={submit}
      lead={
        <p>
          Set a temporary password for <strong>{user.displayName}</strong> ({user.email}). Their current password stops working at once.
        </p>
      }
    >
      <FormField
        label="New temporary password"
        name="password"
        type="text"
        autoComplete="off"
        spellCheck={false}
        hint="At least 10 characters. Tell the person by phone or in person, not in the same e-mail as their address."
      />
      <FormActions submitLabel="Set password" busy={reset.isPending} onCancel={onCancel} />
    </FormShell>
  );
}
