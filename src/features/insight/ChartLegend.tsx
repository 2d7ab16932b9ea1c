// A legend in HTML for the insight charts: each entry draws the same mark as the chart (line, dashes, shape),
// so the key never depends on colour alone.
import type { ReactNode } from "react";

export interface LegendItem {
  label: string;
  swatch: ReactNode;
}

export function ChartLegend({ items }: { items: readonly LegendItem[] }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-caption text-ink" aria-label="Legend">
      {items.map((item) => (
        <li key={item.label} className="inline-flex items-center gap-1.5">
          <svg viewBox="0 0 24 12" className="h-3 w-6 shrink-0" aria-hidden="true">
            {item.swatch}
          </svg>
          {item.label}
        </li>
      ))}
    </ul>
  );
}

export const lineSwatch = (stroke: string, dash?: string, width = 2) => (
  <path d="M1 6h22" stroke={stroke} strokeWidth={width} strokeDasharray={dash} fill="none" />
);

export const shapeSwatch = (shape: "circle" | "up" | "down" | "diamond" | "star" | "bar", fill: string, stroke = fill) => {
  switch (shape) {
    case "circle":
      return <circle cx="12" cy="6" r="4" fill={fill} stroke={stroke} strokeWidth="1.5" />;
    case "up":
      return <path d="M7 10h10L12 1.5z" fill={fill} stroke={stroke} strokeWidth="1.2" />;
    case "down":
      return <path d="M7 2h10L12 10.5z" fill={fill} stroke={stroke} strokeWidth="1.2" />;
    case "diamond":
      return <path d="M12 0.5 17.5 6 12 11.5 6.5 6z" fill={fill} stroke={stroke} strokeWidth="1.2" />;
    case "star":
      return <path d="M12 0.5l1.6 3.6 3.9.4-2.9 2.6.8 3.9L12 9l-3.4 2 .8-3.9-2.9-2.6 3.9-.4z" fill={fill} stroke={stroke} strokeWidth="0.8" />;
    case "bar":
      return <rect x="3" y="2" width="18" height="8" fill={fill} stroke={stroke} />;
  }
};
