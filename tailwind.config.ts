import type { Config } from "tailwindcss";

/**
 * Dragoman's own palette: warm paper, dark ink, a deep sea-green for actions and links,
 * amber for cautions, a muted brick for failures. Chosen for long reading and printed tables.
 */
export default {
  content: ["./index.html", "./client/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f7f4ec", deep: "#efe9dc", edge: "#ddd4c2" },
        ink: { DEFAULT: "#1d2528", soft: "#4a5558", faint: "#5a6467" },
        sea: { DEFAULT: "#24484a", light: "#3c6b6c", wash: "#dde8e4" },
        amber: { DEFAULT: "#7f520f", wash: "#f6ead0" },
        brick: { DEFAULT: "#8f3a2c", wash: "#f4dfd8" },
        moss: { DEFAULT: "#4d6b2f", wash: "#e4ecd6" },
      },
      fontFamily: {
        serif: ['"Source Serif 4"', "Georgia", "serif"],
        mono: ['ui-monospace', '"DejaVu Sans Mono"', "monospace"],
      },
      maxWidth: { page: "72rem" },
    },
  },
} satisfies Config;
