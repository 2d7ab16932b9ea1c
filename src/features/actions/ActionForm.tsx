// Record an improvement action or change one: what, the aim and its target, the scope, the start date, the
// owner and the status. Validated with the shared schema the server uses; the server's messages appear beside
// the same fields.
import { useQuery } from "@tanstack/react-query";
import { actionStatuses } from "../../../shared/domain";
import { aimFigures, newActionSchema, type ActionRow, type NewAction } from "../../../shared/schemas/actions";
import { patientTypes } from "../../../shared/scoring/policy";
import { actionStatusNames, actionWords, aimFigureName, aimGoesUp, dimensionNames, patientTypeNames } from "../../../shared/vocabulary";
import { Button } from "../../components/Button";
import { Input, Select } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { showServerError, useSchemaForm } from "../../lib/useSchemaForm";
import { instructorOptions } from "../instructors/options";
import { instructorQueries } from "../instructors/queries";
import { siteQueries } from "../sites/queries";
import { useCreateAction, useUpdateAction } from "./mutations";

const aimOptions = aimFigures.map((aim) => ({ value: aim, label: aimFigureName(aim) }));
const statusOptions = actionStatuses.map((status) => ({ value: status, label: actionStatusNames[status] }));
const profileOptions = patientTypes.map((profile) => ({ value: profile, label: patientTypeNames[profile] }));

type Values = Omit<NewAction, "target" | "aim" | "status" | "profile"> & {
  aim: NewAction["aim"] | "";
  target: number | null;
  status: NewAction["status"];
  profile: NewAction["profile"];
};

function valuesOf(action: ActionRow | undefined, today: string): Values {
  return action
    ? {
        title: action.title,
        aim: action.aim,
        target: action.target,
        siteId: action.siteId,
        instructorId: action.instructorId,
        profile: action.profile,
        startDate: action.startDate,
        owner: action.owner,
        status: action.status,
      }
    : { title: "", aim: "", target: null, siteId: null, instructorId: null, profile: null, startDate: today, owner: "", status: "planned" };
}

export interface ActionFormProps {
  /** The action to change; without it the form records a new one. */
  action?: ActionRow;
  onDone: (action: ActionRow) => void;
  onCancel: () => void;
  /** Today's date, "YYYY-MM-DD", the start a new action is offered. */
  today?: string;
}

export function ActionForm({ action, onDone, onCancel, today = new Date().toISOString().slice(0, 10) }: ActionFormProps) {
  const create = useCreateAction();
  const update = useUpdateAction();
  const sites = useQuery(siteQueries.list());
  const instructors = useQuery(instructorQueries.list());
  const form = useSchemaForm<NewAction, Values>(newActionSchema, valuesOf(action, today));
  const values = form.watch();
  const fieldErrors = form.formState.errors;
  const errors = Object.fromEntries(Object.entries(fieldErrors).map(([name, error]) => [name, error?.message as string | undefined])) as Partial<
    Record<keyof Values, string>
  >;
  const formError = fieldErrors.root?.server?.message ?? null;
  const setValue = <K extends keyof Values & string>(name: K, value: Values[K]): void =>
    form.setValue(name, value as never, { shouldValidate: form.formState.isSubmitted, shouldDirty: true });
  const setValues = (changes: Partial<Values>) => {
    for (const [name, value] of Object.entries(changes)) setValue(name as keyof Values & string, value as never);
  };
  const pending = create.isPending || update.isPending;

  const submit = form.handleSubmit((values) => {
    const done = { onSuccess: ({ action: saved }: { action: ActionRow }) => onDone(saved), onError: (error: unknown) => showServerError(form, error) };
    if (action) update.mutate({ id: action.id, changes: values }, done);
    else create.mutate(values, done);
  });

  const siteOptions = (sites.data ?? [])
    .filter((site) => site.active || site.id === values.siteId)
    .map((site) => ({ value: String(site.id), label: `${site.code} · ${site.name}` }));
  const aim = values.aim;

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {formError && <Notice tone="error">{formError}</Notice>}
      <Input
        label="What is being done"
        name="title"
        autoComplete="off"
        hint="e.g. Infant depth refresher for the instructors of one site"
        value={values.title}
        onChange={(event) => setValue("title", event.target.value)}
        error={errors.title}
      />
      <Select
        label={actionWords.aim}
        name="aim"
        hint="The figure the action should move."
        placeholder="Choose a figure…"
        options={aimOptions}
        value={aim}
        onChange={(event) => setValue("aim", event.target.value as Values["aim"])}
        error={errors.aim}
      />
      <Input
        label={`${actionWords.target} (%)`}
        name="target"
        type="number"
        inputMode="decimal"
        min={0}
        max={100}
        step="any"
        hint={
          aim === ""
            ? "A percentage from 0 to 100."
            : aimGoesUp(aim)
              ? "Reached when the figure is at or above this."
              : "Reached when the figure is at or below this."
        }
        value={values.target === null ? "" : String(values.target)}
        onChange={(event) => setValue("target", event.target.value === "" ? null : Number(event.target.value))}
        error={errors.target}
      />
      <Select
        label={dimensionNames.site}
        name="siteId"
        optional
        hint="Leave both site and instructor empty for the whole network."
        placeholder={actionWords.network}
        options={siteOptions}
        value={values.siteId === null ? "" : String(values.siteId)}
        onChange={(event) => setValues({ siteId: event.target.value ? Number(event.target.value) : null, instructorId: null })}
        error={errors.siteId}
      />
      <Select
        label={dimensionNames.instructor}
        name="instructorId"
        optional
        hint="An action for one instructor; their site follows from them."
        placeholder="No single instructor"
        options={instructorOptions(instructors.data ?? [], values.instructorId)}
        value={values.instructorId === null ? "" : String(values.instructorId)}
        onChange={(event) => setValues({ instructorId: event.target.value ? Number(event.target.value) : null, siteId: null })}
        error={errors.instructorId}
      />
      <Select
        label={dimensionNames.patientType}
        name="profile"
        optional
        placeholder="Every patient type"
        options={profileOptions}
        value={values.profile ?? ""}
        onChange={(event) => setValue("profile", event.target.value === "" ? null : (event.target.value as Values["profile"]))}
        error={errors.profile}
      />
      <Input
        label={actionWords.startDate}
        name="startDate"
        type="date"
        hint="Figures before this date are the baseline; the quarter it falls in counts as neither side unless the action starts on its first day."
        value={values.startDate}
        onChange={(event) => setValue("startDate", event.target.value)}
        error={errors.startDate}
      />
      <Input
        label={actionWords.owner}
        name="owner"
        autoComplete="off"
        hint="Who leads the action."
        value={values.owner}
        onChange={(event) => setValue("owner", event.target.value)}
        error={errors.owner}
      />
      <Select
        label={actionWords.status}
        name="status"
        options={statusOptions}
        value={values.status}
        onChange={(event) => setValue("status", event.target.value as Values["status"])}
        error={errors.status}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={pending}>
          {action ? "Save changes" : "Record action"}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
