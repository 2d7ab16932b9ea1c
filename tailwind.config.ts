import type { Config } from "tailwindcss";
import { danger, dusk, marigold, neutral, status } from "./src/styles/palette";

// Quarterbeat's design tokens. Loaded from src/styles/app.css with `@config`.
export default {
  content: ["./index.html", "./src/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        dusk,
        marigold,
        paper: neutral.paper,
        surface: neutral.surface,
        line: { DEFAULT: neutral.line, strong: neutral.lineStrong },
        muted: neutral.muted,
        ink: neutral.ink,
        danger,
        "on-target": status.onTarget,
        "too-low": status.tooLow,
        "too-high": status.tooHigh,
      },
      fontFamily: {
        sans: ['"Roboto Flex Variable"', "system-ui", "-apple-system", "Segoe UI", "sans-serif"],
      },
      // A 1.2 ratio scale from a 16 px body; names say what the size is for.
      fontSize: {
        caption: ["0.8125rem", { lineHeight: "1.25rem" }],
        small: ["0.875rem", { lineHeight: "1.375rem" }],
        body: ["1rem", { lineHeight: "1.5rem" }],
        lead: ["1.1875rem", { lineHeight: "1.75rem" }],
        title: ["1.4375rem", { lineHeight: "2rem", fontWeight: "650" }],
        headline: ["1.75rem", { lineHeight: "2.25rem", fontWeight: "700" }],
        display: ["2.5rem", { lineHeight: "2.875rem", fontWeight: "750" }],
      },
      borderRadius: { card: "0.75rem", control: "0.5rem" },
      boxShadow: {
        card: "0 1px 2px rgb(28 27 46 / 0.06), 0 1px 1px rgb(28 27 46 / 0.04)",
        raised: "0 8px 24px rgb(28 27 46 / 0.14)",
      },
      maxWidth: { page: "80rem" },
    },
  },
} satisfies Config;
