import type { Config } from "tailwindcss";

// Fitledger's palette: ink on paper with a slate-teal accent, and three signal hues for findings that
// stay distinguishable for common colour-vision deficiencies (error = brick, warning = ochre, note = slate).
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#fbfaf7", raised: "#ffffff", sunk: "#f2f0ea" },
        ink: { DEFAULT: "#1d2327", soft: "#4a5258", faint: "#7a8288" },
        rule: { DEFAULT: "#dcd8cf", strong: "#b9b3a6" },
        ledger: { DEFAULT: "#2f5d62", deep: "#1f4246", tint: "#e3eeec" },
        finding: {
          error: "#a3392b",
          "error-tint": "#f7e4e0",
          warning: "#8a6212",
          "warning-tint": "#f6ecd4",
          note: "#4f5d75",
          "note-tint": "#e6e9f0",
        },
      },
      fontFamily: {
        sans: ["var(--font-plex)", "ui-sans-serif", "system-ui", "sans-serif"],
        mono: ["ui-monospace", "SFMono-Regular", "Menlo", "monospace"],
      },
      fontSize: { xxs: ["0.6875rem", { lineHeight: "1rem" }] },
    },
  },
};

export default config;
