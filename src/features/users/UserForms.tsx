// The forms of the users page: add an account, edit one, set a temporary password. Each validates with the
// shared schema the server uses and shows the server's own messages beside the fields too.
import { useQuery } from "@tanstack/react-query";
import { roleLabels, userRoles, type UserRole } from "../../../shared/domain";
import { newUserSchema, resetPasswordSchema, updateUserSchema, type UserRow } from "../../../shared/schemas/users";
import { Button } from "../../components/Button";
import { Input, Select } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { useZodForm } from "../../lib/useZodForm";
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

function InstructorSelect({ value, error, onChange }: { value: number | null; error?: string; onChange: (id: number | null) => void }) {
  const instructors = useQuery(instructorQueries.list());
  return (
    <Select
      label="Linked instructor"
      name="instructorId"
      hint={instructors.isError ? "The instructor list could not be loaded." : "The instructor record whose classes this account sees."}
      placeholder={instructors.isPending ? "Loading instructors…" : "Choose an instructor…"}
      options={instructorOptions(instructors.data ?? [], value)}
      value={value === null ? "" : String(value)}
      onChange={(event) => onChange(event.target.value ? Number(event.target.value) : null)}
      error={error}
    />
  );
}

export function AddUserForm({ onDone, onCancel }: { onDone: (user: UserRow) => void; onCancel: () => void }) {
  const create = useCreateUser();
  const form = useZodForm(newUserSchema, {
    email: "",
    displayName: "",
    role: "" as UserRole | "",
    instructorId: null as number | null,
    password: "",
  });
  const submit = form.handleSubmit((user) =>
    create.mutate(user, { onSuccess: ({ user: created }) => onDone(created), onError: form.showServerError }),
  );
  const role = form.values.role;

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <Input
        label="E-mail address"
        name="email"
        type="email"
        autoComplete="off"
        spellCheck={false}
        value={form.values.email}
        onChange={(event) => form.setValue("email", event.target.value)}
        error={form.errors.email}
      />
      <Input
        label="Display name"
        name="displayName"
        autoComplete="off"
        hint="How the person appears in Quarterbeat."
        value={form.values.displayName}
        onChange={(event) => form.setValue("displayName", event.target.value)}
        error={form.errors.displayName}
      />
      <Select
        label="Role"
        name="role"
        placeholder="Choose a role…"
        options={roleOptions}
        hint={role ? roleHints[role] : undefined}
        value={role}
        onChange={(event) => {
          const next = event.target.value as UserRole | "";
          form.setValues(next === "instructor" ? { role: next } : { role: next, instructorId: null });
        }}
        error={form.errors.role}
      />
      {role === "instructor" && (
        <InstructorSelect value={form.values.instructorId} error={form.errors.instructorId} onChange={(id) => form.setValue("instructorId", id)} />
      )}
      <Input
        label="Initial password"
        name="password"
        type="text"
        autoComplete="off"
        spellCheck={false}
        hint="At least 10 characters. Give it to the person by a separate channel; they change it under My account."
        value={form.values.password}
        onChange={(event) => form.setValue("password", event.target.value)}
        error={form.errors.password}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={create.isPending}>
          Add user
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

export function EditUserForm({ user, isSelf, onDone, onCancel }: { user: UserRow; isSelf: boolean; onDone: (user: UserRow) => void; onCancel: () => void }) {
  const update = useUpdateUser();
  const form = useZodForm(
    // The link rule of new accounts applies to edits as well.
    updateUserSchema.refine((u) => u.role !== "instructor" || (u.instructorId ?? null) !== null, {
      message: "An instructor account must be linked to an instructor",
      path: ["instructorId"],
    }),
    { displayName: user.displayName, role: user.role as UserRole, instructorId: user.instructorId },
  );
  const submit = form.handleSubmit((values) => {
    // Send only what changed, so an unchanged role is never re-submitted.
    const changes = Object.fromEntries(
      Object.entries(values).filter(([key, value]) => value !== undefined && value !== user[key as keyof UserRow]),
    );
    if (Object.keys(changes).length === 0) return onDone(user);
    update.mutate({ id: user.id, changes }, { onSuccess: ({ user: saved }) => onDone(saved), onError: form.showServerError });
  });

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      <p className="text-small text-muted">
        E-mail: <span className="font-medium text-ink">{user.email}</span>
      </p>
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <Input
        label="Display name"
        name="displayName"
        value={form.values.displayName}
        onChange={(event) => form.setValue("displayName", event.target.value)}
        error={form.errors.displayName}
      />
      <Select
        label="Role"
        name="role"
        options={roleOptions}
        disabled={isSelf}
        hint={isSelf ? "You cannot change your own role; another coordinator can." : roleHints[form.values.role]}
        value={form.values.role}
        onChange={(event) => {
          const next = event.target.value as UserRole;
          form.setValues(next === "instructor" ? { role: next } : { role: next, instructorId: null });
        }}
        error={form.errors.role}
      />
      {form.values.role === "instructor" && (
        <InstructorSelect value={form.values.instructorId} error={form.errors.instructorId} onChange={(id) => form.setValue("instructorId", id)} />
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={update.isPending}>
          Save changes
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

export function ResetPasswordForm({ user, onDone, onCancel }: { user: UserRow; onDone: () => void; onCancel: () => void }) {
  const reset = useResetUserPassword();
  const form = useZodForm(resetPasswordSchema, { password: "" });
  const submit = form.handleSubmit(({ password }) =>
    reset.mutate({ id: user.id, password }, { onSuccess: onDone, onError: form.showServerError }),
  );
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      <p>
        Set a temporary password for <strong>{user.displayName}</strong> ({user.email}). Their current password stops working at once.
      </p>
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <Input
        label="New temporary password"
        name="password"
        type="text"
        autoComplete="off"
        spellCheck={false}
        hint="At least 10 characters. Tell the person by phone or in person, not in the same e-mail as their address."
        value={form.values.password}
        onChange={(event) => form.setValue("password", event.target.value)}
        error={form.errors.password}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={reset.isPending}>
          Set password
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
