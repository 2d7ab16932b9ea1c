import { cleanup, fireEvent, render, screen, within } from "@testing-library/react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { DataTable, type Column } from "../../src/components/DataTable";

// Rendering with role queries in jsdom is slow on a busy machine; allow for it.
vi.setConfig({ testTimeout: 20_000 });

interface Row {
  code: string;
  name: string;
  share: number | null;
}

const rows: Row[] = [
  { code: "SITE-10", name: "Harbour Hall", share: 0.62 },
  { code: "SITE-2", name: '=HYPERLINK("http://x.example")', share: null },
  { code: "SITE-1", name: "Millbrook Centre", share: 0.81 },
];

const columns: Column<Row>[] = [
  { key: "code", header: "Code", value: (r) => r.code },
  { key: "name", header: "Name", value: (r) => r.name },
  { key: "share", header: "Share", value: (r) => r.share, align: "right" },
  { key: "actions", header: "Actions", value: () => "", sortable: false, exportable: false, render: () => <button type="button">Act</button> },
];

function bodyColumn(index: number): string[] {
  const table = screen.getByRole("table");
  const bodyRows = within(table).getAllByRole("row").slice(1);
  return bodyRows.map((row) => within(row).getAllByRole("cell")[index].textContent ?? "");
}

let exported: Blob[] = [];

beforeEach(() => {
  exported = [];
  URL.createObjectURL = vi.fn((blob: Blob) => {
    exported.push(blob);
    return "blob:test";
  });
  URL.revokeObjectURL = vi.fn();
  vi.spyOn(HTMLAnchorElement.prototype, "click").mockImplementation(() => {});
});

afterEach(() => {
  cleanup();
  vi.restoreAllMocks();
});

describe("DataTable", () => {
  it("sorts by a column, numerically for codes with numbers, and reverses on a second click", () => {
    render(<DataTable caption="Sites" columns={columns} rows={rows} rowKey={(r) => r.code} />);
    const codeHeader = screen.getByRole("columnheader", { name: /code/i });
    expect(codeHeader.getAttribute("aria-sort")).toBe("none");

    fireEvent.click(screen.getByRole("button", { name: /code/i }));
    expect(bodyColumn(0)).toEqual(["SITE-1", "SITE-2", "SITE-10"]);
    expect(codeHeader.getAttribute("aria-sort")).toBe("ascending");

    fireEvent.click(screen.getByRole("button", { name: /code/i }));
    expect(bodyColumn(0)).toEqual(["SITE-10", "SITE-2", "SITE-1"]);
    expect(codeHeader.getAttribute("aria-sort")).toBe("descending");
  });

  it("keeps empty cells last in both directions", () => {
    render(<DataTable caption="Sites" columns={columns} rows={rows} rowKey={(r) => r.code} />);
    fireEvent.click(screen.getByRole("button", { name: /share/i }));
    expect(bodyColumn(2)).toEqual(["0.62", "0.81", ""]);
    fireEvent.click(screen.getByRole("button", { name: /share/i }));
    expect(bodyColumn(2)).toEqual(["0.81", "0.62", ""]);
  });

  it("does not offer sorting on a column marked unsortable", () => {
    render(<DataTable caption="Sites" columns={columns} rows={rows} rowKey={(r) => r.code} />);
    expect(screen.queryByRole("button", { name: /^actions/i })).toBeNull();
  });

  it("filters rows by any column's text and says how many are shown", () => {
    render(<DataTable caption="Sites" columns={columns} rows={rows} rowKey={(r) => r.code} />);
    fireEvent.change(screen.getByLabelText("Filter sites"), { target: { value: "millbrook" } });
    expect(bodyColumn(0)).toEqual(["SITE-1"]);
    expect(screen.getByText("Showing 1 of 3 rows")).toBeTruthy();
  });

  it("exports the rows shown, in the order shown, with formulas neutralised and action columns left out", async () => {
    render(<DataTable caption="Sites" columns={columns} rows={rows} rowKey={(r) => r.code} exportFileName="sites" />);
    fireEvent.click(screen.getByRole("button", { name: /code/i }));
    fireEvent.click(screen.getByRole("button", { name: "Export CSV" }));

    expect(exported).toHaveLength(1);
    const text = (await exported[0].text()).replace(/^\uFEFF/, "");
    expect(text).toBe(
      ["Code,Name,Share", "SITE-1,Millbrook Centre,0.81", `SITE-2,"'=HYPERLINK(""http://x.example"")",`, "SITE-10,Harbour Hall,0.62", ""].join("\r\n"),
    );
  });

  it("exports only the filtered rows", async () => {
    render(<DataTable caption="Sites" columns={columns} rows={rows} rowKey={(r) => r.code} exportFileName="sites" />);
    fireEvent.change(screen.getByLabelText("Filter sites"), { target: { value: "harbour" } });
    fireEvent.click(screen.getByRole("button", { name: "Export CSV" }));
    const text = (await exported[0].text()).replace(/^\uFEFF/, "");
    expect(text).toBe("Code,Name,Share\r\nSITE-10,Harbour Hall,0.62\r\n");
  });
});

describe("the phone's sort choice", () => {
  it("words a column of dates as oldest or newest first, text as A to Z and numbers as lowest or highest first", async () => {
    const { PhoneSortSelect } = await import("../../src/components/DataTable");
    interface Dated {
      date: string;
      site: string;
      n: number;
    }
    const dated: Column<Dated>[] = [
      { key: "date", header: "Date", value: (r) => r.date },
      { key: "site", header: "Site", value: (r) => r.site },
      { key: "n", header: "Learners", value: (r) => r.n, align: "right" },
    ];
    render(<PhoneSortSelect id="sort" columns={dated} sort={null} onChange={() => {}} rows={[{ date: "2026-07-14", site: "North", n: 8 }]} />);
    const options = within(screen.getByLabelText("Sort by"))
      .getAllByRole("option")
      .map((o) => o.textContent);
    expect(options).toEqual([
      "As listed",
      "Date, oldest first",
      "Date, newest first",
      "Site, A to Z",
      "Site, Z to A",
      "Learners, lowest first",
      "Learners, highest first",
    ]);
  });
  it("leaves a line that does not apply to a row out of its phone card, and keeps a missing value as a dash", () => {
    const events = [
      { id: "e1", event: "Fault", resolved: "No", note: null },
      { id: "e2", event: "Cleaned", resolved: "", note: null },
    ];
    render(
      <DataTable
        caption="Log"
        columns={[
          { key: "event", header: "Event", value: (r) => r.event },
          { key: "resolved", header: "Fault resolved", value: (r) => r.resolved },
          { key: "note", header: "Note", value: (r) => r.note },
        ]}
        rows={events}
        rowKey={(r) => r.id}
      />,
    );
    const [fault, cleaned] = within(screen.getByRole("list", { name: "Log" })).getAllByRole("listitem");
    expect(within(fault).getByText("Fault resolved")).toBeTruthy();
    expect(within(cleaned).queryByText("Fault resolved")).toBeNull();
    expect(within(cleaned).getByText("Note")).toBeTruthy();
  });
});
