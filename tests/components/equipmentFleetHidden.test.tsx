// The fleet table for a viewer from whom some of a manikin's use is hidden (an instructor looking at a
// quarter that holds too few other instructors' attempts): it says "Hidden", never a total that leaves the
// hidden quarter out.
import { cleanup, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import type { EquipmentAnswer } from "../../shared/schemas/equipment";
import { FleetTable } from "../../src/features/equipment/FleetTable";

afterEach(cleanup);

const manikin = (id: number, assetId: string, usage: EquipmentAnswer["fleet"][number]["usage"]): EquipmentAnswer["fleet"][number] => ({
  id,
  assetId,
  patientType: "child",
  site: { id: 1, code: "NTH" },
  inServiceSince: "2024-01-01",
  retiredOn: null,
  usage,
  compressionsSinceService: 0,
  lastServiceDate: null,
  openFaults: 0,
});

const answer = {
  period: { from: "2026-Q1", to: "2026-Q2", quarters: ["2026-Q1", "2026-Q2"] },
  fleet: [
    manikin(1, "MK-SHOWN", [
      { quarter: "2026-Q1", attempts: 12, compressions: 1200 },
      { quarter: "2026-Q2", attempts: 8, compressions: 800 },
    ]),
    manikin(2, "MK-HIDDEN", [
      { quarter: "2026-Q1", attempts: 30, compressions: 3000 },
      { quarter: "2026-Q2", attempts: null, compressions: null },
    ]),
  ],
  attention: [],
} as unknown as EquipmentAnswer;

describe("fleet table with hidden use", () => {
  it("sums the period where every quarter is shown and says Hidden where one is not", () => {
    render(<FleetTable answer={answer} />);
    const rowOf = (assetId: string) => screen.getAllByText(assetId)[0].closest("tr, li, [role=row]") as HTMLElement;
    expect(within(rowOf("MK-SHOWN")).getByText("20")).toBeTruthy();
    expect(within(rowOf("MK-SHOWN")).getByText("2,000")).toBeTruthy();
    expect(within(rowOf("MK-HIDDEN")).getAllByText("Hidden")).toHaveLength(2);
    // the shown quarter's 30 is not passed off as the period's total
    expect(within(rowOf("MK-HIDDEN")).queryByText("30")).toBeNull();
  });
});
