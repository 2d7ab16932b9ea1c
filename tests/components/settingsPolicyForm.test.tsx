import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { POLICY_FIELD_SOURCES } from "../../shared/schemas/policySettings";
import { DEFAULT_POLICY, type NetworkPolicy } from "../../shared/scoring/policy";
import { PolicyForm } from "../../src/features/settings/PolicyForm";

afterEach(cleanup);

function renderForm(unit: "mm" | "in", onSave = vi.fn()) {
  render(
    <PolicyForm
      current={{ version: 3, policy: DEFAULT_POLICY }}
      defaults={DEFAULT_POLICY}
      fieldSources={POLICY_FIELD_SOURCES}
      unit={unit}
      canEdit
      onSave={onSave}
    />,
  );
  return onSave;
}

const adult = () => screen.getByRole("group", { name: "Adult" });
const type = (label: string, value: string) => fireEvent.change(within(adult()).getByLabelText(label), { target: { value } });
const save = () => fireEvent.click(screen.getByRole("button", { name: "Save as version 4" }));

describe("policy form", { timeout: 30_000 }, () => {
  it("shows the schema's message beside the field when the minimum depth exceeds the maximum, and does not save", () => {
    const onSave = renderForm("mm");
    type("Depth at least (mm)", "62");
    save();
    const max = within(adult()).getByLabelText("Depth at most (mm)");
    expect(max.getAttribute("aria-invalid")).toBe("true");
    const messageId = max.getAttribute("aria-describedby")!.split(" ")[0];
    expect(document.getElementById(messageId)?.textContent).toBe("Minimum depth must not exceed maximum depth");
    expect(onSave).not.toHaveBeenCalled();

    // The message follows each keystroke after the first try.
    type("Depth at least (mm)", "52");
    expect(within(adult()).queryByText("Minimum depth must not exceed maximum depth")).toBeNull();
  });

  it("shows each default with its source beside the field", () => {
    renderForm("mm");
    expect(within(adult()).getByText(/Default 50 mm — guideline: AHA 2020 adult, ERC 2021 BLS/)).toBeTruthy();
    expect(screen.getByText(/Default 2 s — project default/)).toBeTruthy();
  });

  it("converts depths typed in inches to millimetres on save and leaves untouched values exactly as stored", () => {
    const onSave = renderForm("in");
    // Shown in inches: 50 mm = 1.969 in.
    expect((within(adult()).getByLabelText("Depth at least (in)") as HTMLInputElement).value).toBe("1.969");
    // AHA 2020 adult: at least 2 in, not more than 2.4 in. 1 in = 25.4 mm (1959 international yard and pound
    // agreement), so 2 in = 50.8 mm and 2.4 in = 60.96 mm.
    type("Depth at least (in)", "2");
    type("Depth at most (in)", "2.4");
    save();
    expect(onSave).toHaveBeenCalledTimes(1);
    const [policy, note] = onSave.mock.calls[0] as [NetworkPolicy, string];
    expect(policy.bands.adult.depthMinMm).toBe(50.8);
    expect(policy.bands.adult.depthMaxMm).toBe(60.96);
    expect(policy.bands.adult.recoilMaxMm).toBe(5);
    expect(policy.bands.child).toEqual(DEFAULT_POLICY.bands.child);
    expect(policy.bands.infant).toEqual(DEFAULT_POLICY.bands.infant);
    expect(policy.passRule).toEqual(DEFAULT_POLICY.passRule);
    expect(note).toBe("");
  });

  it("names a min > max problem in inches too", () => {
    const onSave = renderForm("in");
    type("Depth at least (in)", "2.5");
    type("Depth at most (in)", "2.4");
    save();
    expect(within(adult()).getByText("Minimum depth must not exceed maximum depth")).toBeTruthy();
    expect(onSave).not.toHaveBeenCalled();
  });
});
