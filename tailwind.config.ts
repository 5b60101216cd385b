import type { Config } from "tailwindcss";

// Sondage's identity: ink on warm paper, a deep "ledger" green for actions, amber for attention.
export default {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      fontFamily: {
        sans: ["'Inter Variable'", "system-ui", "sans-serif"],
        figures: ["'IBM Plex Mono'", "ui-monospace", "monospace"],
      },
      colors: {
        paper: { DEFAULT: "#f6f4ee", raised: "#fffdf8", sunk: "#ece8dd" },
        ink: { DEFAULT: "#1d2430", soft: "#4a5363", faint: "#596272", line: "#d9d4c7" },
        ledger: { 50: "#eef6f1", 100: "#d5eadd", 500: "#2f7a54", 600: "#24663f", 700: "#1b5132", 900: "#0f2e1d" },
        amber: { 50: "#fdf6e7", 100: "#f8e6bd", 500: "#c98a12", 700: "#8a5d07" },
        brick: { 50: "#fbeeea", 100: "#f3d2c8", 500: "#b5432a", 700: "#85301d" },
        slate: { 50: "#f0f3f7", 100: "#dfe5ee", 500: "#5a6b85", 700: "#37445a" },
        // Chart series that the palette above has no colour for (the advisor's estimators), and chart rules.
        chart: {
          "mean-per-unit": "#55606e",
          regression: "#6b4f9e",
          "hartley-ross": "#2f6f8f",
          "jackknife-ratio": "#8a6d1f",
          "beale-ratio": "#a0522d",
          "tin-ratio": "#4d7a6a",
          grid: "#e6e1d5",
          truth: "#1f2328",
        },
      },
      borderRadius: { card: "10px" },
      boxShadow: { card: "0 1px 0 rgba(29,36,48,0.04), 0 1px 3px rgba(29,36,48,0.08)" },
    },
  },
} satisfies Config;
