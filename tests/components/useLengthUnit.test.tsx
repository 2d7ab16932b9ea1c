import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { cleanup, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import type { SessionAnswer } from "../../shared/schemas/auth";
import type { LengthUnit } from "../../shared/units";
import { authQueries } from "../../src/features/auth/queries";
import { useLengthUnit } from "../../src/lib/useLengthUnit";

afterEach(cleanup);

function Depth({ mm }: { mm: number }) {
  const { formatLength } = useLengthUnit();
  return <span data-testid="depth">{formatLength(mm)}</span>;
}

function renderFor(unit: LengthUnit | null, mm: number) {
  const client = new QueryClient();
  const answer: SessionAnswer | null =
    unit === null
      ? null
      : { user: { id: 1, email: "a@example.org", displayName: "A", role: "instructor", instructorId: 1, siteId: null, lengthUnit: unit }, csrfToken: "t" };
  client.setQueryData(authQueries.me().queryKey, answer);
  render(
    <QueryClientProvider client={client}>
      <Depth mm={mm} />
    </QueryClientProvider>,
  );
  return screen.getByTestId("depth").textContent;
}

describe("useLengthUnit", () => {
  // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959): 2 in = 50.8 mm.
  it("shows lengths in the signed-in user's unit", () => {
    expect(renderFor("in", 50.8)).toBe("2.00 in");
    cleanup();
    expect(renderFor("cm", 50.8)).toBe("5.1 cm");
    cleanup();
    expect(renderFor("mm", 50.8)).toBe("50.8 mm");
  });

  it("falls back to millimetres before the session is known", () => {
    expect(renderFor(null, 38.1)).toBe("38.1 mm");
  });
});
