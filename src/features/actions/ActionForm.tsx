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
import { useZodForm } from "../../lib/useZodForm";
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
  const form = useZodForm(newActionSchema, valuesOf(action, today));
  const pending = create.isPending || update.isPending;

  const submit = form.handleSubmit((values) => {
    const done = { onSuccess: ({ action: saved }: { action: ActionRow }) => onDone(saved), onError: form.showServerError };
    if (action) update.mutate({ id: action.id, changes: values }, done);
    else create.mutate(values, done);
  });

  const siteOptions = (sites.data ?? []).filter((site) => site.active || site.id === form.values.siteId).map((site) => ({ value: String(site.id), label: `${site.code} · ${site.name}` }));
  const aim = form.values.aim;

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <Input
        label="What is being done"
        name="title"
        autoComplete="off"
        hint="e.g. Infant depth refresher for the instructors of one site"
        value={form.values.title}
        onChange={(event) => form.setValue("title", event.target.value)}
        error={form.errors.title}
      />
      <Select
        label={actionWords.aim}
        name="aim"
        hint="The figure the action should move."
        placeholder="Choose a figure…"
        options={aimOptions}
        value={aim}
        onChange={(event) => form.setValue("aim", event.target.value as Values["aim"])}
        error={form.errors.aim}
      />
      <Input
        label={`${actionWords.target} (%)`}
        name="target"
        type="number"
        inputMode="decimal"
        min={0}
        max={100}
        step="any"
        hint={aim === "" ? "A percentage from 0 to 100." : aimGoesUp(aim) ? "Reached when the figure is at or above this." : "Reached when the figure is at or below this."}
        value={form.values.target === null ? "" : String(form.values.target)}
        onChange={(event) => form.setValue("target", event.target.value === "" ? null : Number(event.target.value))}
        error={form.errors.target}
      />
      <Select
        label={dimensionNames.site}
        name="siteId"
        optional
        hint="Leave both site and instructor empty for the whole network."
        placeholder={actionWords.network}
        options={siteOptions}
        value={form.values.siteId === null ? "" : String(form.values.siteId)}
        onChange={(event) => form.setValues({ siteId: event.target.value ? Number(event.target.value) : null, instructorId: null })}
        error={form.errors.siteId}
      />
      <Select
        label={dimensionNames.instructor}
        name="instructorId"
        optional
        hint="An action for one instructor; their site follows from them."
        placeholder="No single instructor"
        options={instructorOptions(instructors.data ?? [], form.values.instructorId)}
        value={form.values.instructorId === null ? "" : String(form.values.instructorId)}
        onChange={(event) => form.setValues({ instructorId: event.target.value ? Number(event.target.value) : null, siteId: null })}
        error={form.errors.instructorId}
      />
      <Select
        label={dimensionNames.patientType}
        name="profile"
        optional
        placeholder="Every patient type"
        options={profileOptions}
        value={form.values.profile ?? ""}
        onChange={(event) => form.setValue("profile", event.target.value === "" ? null : (event.target.value as Values["profile"]))}
        error={form.errors.profile}
      />
      <Input
        label={actionWords.startDate}
        name="startDate"
        type="date"
        hint="Figures before this date are the baseline; the quarter it falls in counts as neither side unless the action starts on its first day."
        value={form.values.startDate}
        onChange={(event) => form.setValue("startDate", event.target.value)}
        error={form.errors.startDate}
      />
      <Input
        label={actionWords.owner}
        name="owner"
        autoComplete="off"
        hint="Who leads the action."
        value={form.values.owner}
        onChange={(event) => form.setValue("owner", event.target.value)}
        error={form.errors.owner}
      />
      <Select
        label={actionWords.status}
        name="status"
        options={statusOptions}
        value={form.values.status}
        onChange={(event) => form.setValue("status", event.target.value as Values["status"])}
        error={form.errors.status}
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
