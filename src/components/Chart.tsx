// A chart drawn by Observable Plot, always with the same data one click away as a table and a written
// description for people who cannot see the picture.
//
//   <Chart title="Compressions in target range" description="Share per quarter, rising from 58 % to 71 %."
//          data={rows} columns={tableColumns} rowKey={(r) => r.quarter}
//          plot={(data, { width }) => ({ marks: [Plot.barY(data, { x: "quarter", y: "share" })] })} />
//
// Keep `plot` stable (define it outside the component or in useCallback) so the chart is not redrawn on
// every render.
//
// A mark with Plot's `href` channel is a door to the rows behind it: a click follows the link inside the app.
// Keyboard and screen-reader users reach the same places from the table view's links (the picture is one
// image to assistive technology, with nothing to focus inside it).
import * as Plot from "@observablehq/plot";
import { useEffect, useId, useRef, useState, type ReactNode, type RefObject } from "react";
import { useInRouterContext, useNavigate } from "react-router";
import { chartSeries } from "../styles/palette";
import { DataTable, type Column } from "./DataTable";

export interface ChartSize {
  width: number;
}

export interface ChartProps<Row> {
  title: string;
  /** What the chart shows and what to notice, in a sentence or two. Read out instead of the picture. */
  description: string;
  data: readonly Row[];
  /** Columns of the table view (and its CSV). */
  columns: readonly Column<Row>[];
  rowKey: (row: Row) => string | number;
  /** Plot options for this data; width is filled in to fit the space. */
  plot: (data: readonly Row[], size: ChartSize) => Plot.PlotOptions;
  /** Offer the table view's CSV under this file name. */
  exportFileName?: string;
  /** Start with the table showing. */
  initiallyTable?: boolean;
  /** A legend drawn in HTML above the plot (e.g. <TargetLegend />), when Plot's own legend is not enough. */
  legend?: ReactNode;
}

const fallbackWidth = 640;

export function Chart<Row>({ title, description, data, columns, rowKey, plot, exportFileName, initiallyTable = false, legend }: ChartProps<Row>) {
  const [showTable, setShowTable] = useState(initiallyTable);
  const [width, setWidth] = useState(fallbackWidth);
  const frameRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<HTMLDivElement>(null);
  const titleId = useId();
  const descriptionId = useId();
  const inRouter = useInRouterContext();

  // Follow the container's width so the chart fits phones and wide screens alike.
  useEffect(() => {
    const frame = frameRef.current;
    if (!frame || typeof ResizeObserver === "undefined") return;
    const observer = new ResizeObserver(([entry]) => {
      const next = Math.floor(entry.contentRect.width);
      if (next > 0) setWidth(next);
    });
    observer.observe(frame);
    return () => observer.disconnect();
  }, []);

  useEffect(() => {
    const target = plotRef.current;
    if (!target || showTable) return;
    const options = plot(data, { width });
    const figure = Plot.plot({
      color: { range: chartSeries },
      ...options,
      width,
      ariaLabel: null,
      ariaDescription: null,
      style: {
        fontFamily: "inherit",
        fontSize: "12px",
        background: "transparent",
        overflow: "visible",
        ...(typeof options.style === "object" ? options.style : {}),
      },
    });
    // Plot names each mark's <g> ("bar", "rule"); inside role="img" those names are not allowed and say nothing.
    figure.querySelectorAll("g[aria-label]").forEach((mark) => mark.removeAttribute("aria-label"));
    // Plot wraps a linked mark in <a>; a link inside an image is an interactive control nested in a
    // non-interactive one, so it becomes a plain group that remembers its address
    figure.querySelectorAll("a").forEach((link) => {
      const group = document.createElementNS("http://www.w3.org/2000/svg", "g");
      group.setAttribute("class", "chart-mark-link");
      group.setAttribute("data-href", link.getAttribute("href") ?? "");
      group.replaceChildren(...link.childNodes);
      link.replaceWith(group);
    });
    target.replaceChildren(figure);
    return () => figure.remove();
  }, [data, plot, width, showTable]);

  return (
    <figure className="flex flex-col gap-3 rounded-card border border-line bg-surface p-4 shadow-card">
      <figcaption className="flex flex-wrap items-start justify-between gap-3">
        <div className="max-w-2xl">
          <h3 id={titleId} className="text-lead font-semibold text-ink">
            {title}
          </h3>
          <p id={descriptionId} className="text-small text-muted">
            {description}
          </p>
        </div>
        <button
          type="button"
          onClick={() => setShowTable((current) => !current)}
          className="inline-flex min-h-9 items-center gap-2 rounded-control border border-line-strong bg-surface px-3 text-small font-medium text-dusk-800 hover:bg-dusk-50"
        >
          <svg viewBox="0 0 16 16" className="size-4" aria-hidden="true">
            {showTable ? (
              <path d="M2 14V8m4 6V4m4 10V7m4 7V2" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
            ) : (
              <path d="M2 3h12M2 8h12M2 13h12" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
            )}
          </svg>
          {showTable ? "Show as chart" : "Show as table"}
        </button>
      </figcaption>
      <div ref={frameRef} className="min-w-0">
        {showTable ? (
          <DataTable
            caption={title}
            captionHidden
            columns={columns}
            rows={data}
            rowKey={rowKey}
            filterable={false}
            exportFileName={exportFileName}
            phoneLayout="scroll"
          />
        ) : (
          <>
            {legend && <div className="mb-2">{legend}</div>}
            {/* The picture itself is one image to assistive technology; its words are the caption above. */}
            <div ref={plotRef} role="img" aria-labelledby={titleId} aria-describedby={descriptionId} className="overflow-x-auto" />
            {inRouter && <MarkLinkFollower target={plotRef} />}
          </>
        )}
      </div>
    </figure>
  );
}

/** Follows a click on a linked mark inside the app instead of reloading the page. */
function MarkLinkFollower({ target }: { target: RefObject<HTMLDivElement | null> }) {
  const navigate = useNavigate();
  useEffect(() => {
    const element = target.current;
    if (!element) return;
    function follow(event: MouseEvent) {
      if (event.defaultPrevented || event.button !== 0) return;
      const href = (event.target as Element | null)?.closest("[data-href]")?.getAttribute("data-href");
      if (!href || !href.startsWith("/")) return;
      event.preventDefault();
      navigate(href);
    }
    element.addEventListener("click", follow);
    return () => element.removeEventListener("click", follow);
  }, [target, navigate]);
  return null;
}
