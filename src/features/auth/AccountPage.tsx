// My account: who I am, my password, the unit lengths are shown in, and which alerts I am mailed after imports.
import { useState } from "react";
import { Link } from "react-router";
import { lengthUnits, roleLabels } from "../../../shared/domain";
import { changePasswordSchema, type ChangePassword } from "../../../shared/schemas/auth";
import { formatLength, type LengthUnit } from "../../../shared/units";
import { Button } from "../../components/Button";
import { FormField } from "../../components/FormField";
import { FormShell } from "../../components/FormShell";
import { Notice } from "../../components/Notice";
import { PageHeader } from "../../components/PageHeader";
import { errorMessage } from "../../components/States";
import { AlertChoiceSection } from "../alerts/AlertChoiceSection";
import { useChangePassword, useUpdateLengthUnit } from "./mutations";
import { useCan } from "./useCan";
import { useCurrentUser } from "./useSession";
import { lengthUnitNames } from "../../lib/useLengthUnit";
import { showServerError, useSchemaForm } from "../../lib/useSchemaForm";

export default function AccountPage() {
  const user = useCurrentUser();
  const receivesAlerts = useCan("receiveImportAlerts");
  return (
    <div>
      <PageHeader title="My account" description="Your details, your password and how Quarterbeat shows lengths to you." />
      <div className="grid items-start gap-6 lg:grid-cols-2">
        <div className="flex flex-col gap-6">
          <section aria-labelledby="account-details" className="rounded-card border border-line bg-surface p-5 shadow-card">
            <h2 id="account-details" className="mb-3 text-title">
              Details
            </h2>
            <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2">
              <dt className="text-muted">Name</dt>
              <dd className="font-medium">{user.displayName}</dd>
              <dt className="text-muted">E-mail</dt>
              <dd className="font-medium [overflow-wrap:anywhere]">{user.email}</dd>
              <dt className="text-muted">Role</dt>
              <dd className="font-medium">{roleLabels[user.role]}</dd>
            </dl>
            <DetailsChangeNote />
          </section>
          <ChangePasswordSection email={user.email} />
        </div>
        <div className="flex flex-col gap-6">
          <LengthUnitSection unit={user.lengthUnit} />
          {receivesAlerts && <AlertChoiceSection />}
        </div>
      </div>
    </div>
  );
}

/** Who changes these details: someone who manages the accounts does it on the Users page, everyone else asks them. */
function DetailsChangeNote() {
  const managesUsers = useCan("manageUsers");
  return managesUsers ? (
    <p className="mt-4 text-small text-muted">
      You manage the network's accounts: change your name or e-mail on the{" "}
      <Link to="/admin/users" className="font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
        Users
      </Link>{" "}
      page. Your own coordinator role stays, so the network always has someone who can manage accounts.
    </p>
  ) : (
    <p className="mt-4 text-small text-muted">To change your name, e-mail or role, ask your regional coordinator.</p>
  );
}

const exampleDepthMm = 50.8; // 2 in, a common adult depth figure: shows the rounding of each unit

function LengthUnitSection({ unit }: { unit: LengthUnit }) {
  const update = useUpdateLengthUnit();
  const [message, setMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);

  function choose(next: LengthUnit) {
    setMessage(null);
    update.mutate(next, {
      onSuccess: () => setMessage({ tone: "success", text: `Saved. Lengths now show in ${lengthUnitNames[next]}.` }),
      onError: (error) => setMessage({ tone: "error", text: `Not saved: ${errorMessage(error)}` }),
    });
  }

  return (
    <section aria-labelledby="account-units" className="rounded-card border border-line bg-surface p-5 shadow-card">
      <h2 id="account-units" className="mb-1 text-title">
        Length unit
      </h2>
      <p className="mb-3 text-small text-muted">Used for compression depth and recoil everywhere in Quarterbeat. Saved as soon as you choose.</p>
      <fieldset disabled={update.isPending}>
        <legend className="sr-only">Show lengths in</legend>
        <div className="flex flex-col gap-2">
          {lengthUnits.map((option) => (
            <label
              key={option}
              className="flex min-h-11 cursor-pointer items-center gap-3 rounded-control border border-line px-3 has-checked:border-dusk-600 has-checked:bg-dusk-50"
            >
              <input
                type="radio"
                name="lengthUnit"
                value={option}
                checked={(update.isPending ? update.variables : unit) === option}
                onChange={() => choose(option)}
                className="size-4 accent-dusk-700"
              />
              <span className="font-medium capitalize">{lengthUnitNames[option]}</span>
              <span className="ml-auto text-small text-muted tabular-nums">e.g. {formatLength(exampleDepthMm, option)}</span>
            </label>
          ))}
        </div>
      </fieldset>
      {message && (
        <Notice tone={message.tone} className="mt-3">
          {message.text}
        </Notice>
      )}
    </section>
  );
}

const emptyPasswords = { currentPassword: "", newPassword: "", confirmPassword: "" };

function ChangePasswordSection({ email }: { email: string }) {
  const change = useChangePassword();
  const form = useSchemaForm(changePasswordSchema, emptyPasswords);
  const [saved, setSaved] = useState(false);

  function submit(values: ChangePassword) {
    setSaved(false);
    change.mutate(values, {
      onSuccess: () => {
        form.reset(emptyPasswords);
        setSaved(true);
      },
      onError: (error) => showServerError(form, error),
    });
  }

  return (
    <section aria-labelledby="account-password" className="rounded-card border border-line bg-surface p-5 shadow-card">
      <h2 id="account-password" className="mb-3 text-title">
        Change password
      </h2>
      {saved && (
        <Notice tone="success" className="mb-3">
          Password changed. Use the new one next time you sign in.
        </Notice>
      )}
      <FormShell form={form} onValid={submit}>
        {/* Lets password managers file the new password under the right account. */}
        <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
        <FormField label="Current password" name="currentPassword" type="password" autoComplete="current-password" />
        <FormField
          label="New password"
          name="newPassword"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters. A few unrelated words make a strong password that is easy to type."
        />
        <FormField label="New password again" name="confirmPassword" type="password" autoComplete="new-password" />
        <Button type="submit" busy={change.isPending} className="self-start">
          Change password
        </Button>
      </FormShell>
    </section>
  );
}
