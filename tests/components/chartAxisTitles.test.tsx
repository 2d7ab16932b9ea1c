// The y-axis title of the insight charts stays clear of the top tick label at a phone's width.
import { cleanup, render } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { SpreadChart } from "../../src/features/insight/charts/SpreadChart";

vi.setConfig({ testTimeout: 20_000 });
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

/** The vertical position of an SVG element after its own and its group's translate(). */
function translatedY(element: Element): number {
  let y = 0;
  for (let node: Element | null = element; node && node.tagName.toLowerCase() !== "svg"; node = node.parentElement) {
    const match = /translate\(\s*[-\d.]+\s*,\s*([-\d.]+)\s*\)/.exec(node.getAttribute("transform") ?? "");
    if (match) y += Number(match[1]);
  }
  return y;
}

describe("axis titles", () => {
  it("leave the top tick label free at 360 px wide", () => {
    // the chart follows its container's width: report a phone's
    vi.stubGlobal(
      "ResizeObserver",
      class {
        constructor(private readonly callback: ResizeObserverCallback) {}
        observe(target: Element) {
          this.callback([{ target, contentRect: { width: 360 } } as unknown as ResizeObserverEntry], this as unknown as ResizeObserver);
        }
        unobserve() {}
        disconnect() {}
      },
    );
    const points = [
      { medianScore: 62, passRate: 0.4, isMe: false },
      { medianScore: 71, passRate: 0.55, isMe: true },
      { medianScore: 80, passRate: 0.9, isMe: false },
    ];
    const { container } = render(<SpreadChart points={points} minAttempts={10} instructorsLeftOut={0} />);
    const svg = container.querySelector("svg[width='360']") ?? container.querySelector("figure svg, svg");
    expect(svg?.getAttribute("width")).toBe("360");
    const texts = [...svg!.querySelectorAll("text")];
    const title = texts.find((t) => t.textContent?.startsWith("↑"))!;
    expect(title.textContent).toBe("↑ Pass rate");
    // the y tick labels: right-aligned percentages
    const ticks = texts.filter((t) => /^\d+ %$/.test(t.textContent ?? "") && t.parentElement?.getAttribute("text-anchor") === "end");
    expect(ticks.length).toBeGreaterThan(2);
    const topTick = Math.min(...ticks.map(translatedY));
    // 12 px text (the charts' font size): the title's top sits at its y (dy 0.71em puts the cap line there),
    // descenders reach about 1.2 em below; the tick label is centred on its y (dy 0.32em)
    const fontPx = 12;
    const titleBottom = translatedY(title) + 1.2 * fontPx;
    const tickTop = topTick - 0.6 * fontPx;
    expect(titleBottom).toBeLessThanOrEqual(tickTop);
  });
});
