// Quarterbeat's colours, in one place for both Tailwind (tailwind.config.ts) and the charts (Observable Plot
// needs plain colour values). Contrast ratios are against white unless noted; WCAG AA asks 4.5 for text.

/** Dusk: the brand indigo-violet. 700 carries white text at 9.6:1. */
export const dusk = {
  50: "#F1F0FA",
  100: "#E2E0F4",
  200: "#C6C2EA",
  300: "#A19BD9",
  400: "#7A72C4",
  500: "#5A52AC",
  600: "#4A439C",
  700: "#3F3A8C",
  800: "#2E2A6B",
  900: "#1F1C4A",
} as const;

/** Marigold: the accent (logo quarter, highlights). Never text on white; dark ink on marigold is 7.8:1. */
export const marigold = {
  100: "#FCF0DA",
  300: "#F3C877",
  500: "#E8A33D",
  700: "#9A6410",
} as const;

/** Neutrals: warm paper background, ink text (15.3:1 on paper), muted text (6.7:1 on paper). */
export const neutral = {
  paper: "#F6F4EE",
  surface: "#FFFFFF",
  line: "#D9D5CA",
  lineStrong: "#A9A49A",
  muted: "#55536B",
  ink: "#1C1B2E",
} as const;

/**
 * Target status, from the Okabe–Ito colour-blind-safe set (bluish green, blue, vermillion), darkened so the
 * text colours reach at least 5:1 on their tint. Always shown with a shape and a word, never colour alone.
 */
export const status = {
  onTarget: { text: "#00704F", tint: "#E3F4EC", mark: "#009E73" },
  tooLow: { text: "#005A8F", tint: "#E4F0F8", mark: "#0072B2" },
  tooHigh: { text: "#A14400", tint: "#FBEBDD", mark: "#D55E00" },
} as const;

/** Problems in forms and failed requests: a raspberry that stays clear of "medical red" (7.9:1). */
export const danger = { text: "#9B1D4A", tint: "#FBE9EF", line: "#D98AA6" } as const;

/** Categorical series for charts (Okabe–Ito order, distinguishable with the common colour-vision deficiencies). */
export const chartSeries = ["#3F3A8C", "#E69F00", "#009E73", "#0072B2", "#D55E00", "#CC79A7", "#56B4E9", "#6E6A85"];
