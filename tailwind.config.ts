import type { Config } from "tailwindcss";

// VisViva's design tokens. Loaded by Tailwind v4 through the @config line in app/globals.css.
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        // Night-sky ink for text and chrome, a paper white for reading surfaces.
        ink: {
          950: "#0b1020",
          900: "#121a30",
          800: "#1d2742",
          700: "#2c3858",
          600: "#45537a",
          500: "#65729a",
          400: "#8d98ba",
          300: "#b7bfd6",
          200: "#d9deeb",
          100: "#edf0f7",
          50: "#f7f8fc",
        },
        paper: "#fdfcf8",
        // The brand hue: a cool periwinkle "trajectory" blue.
        trajectory: { 700: "#3a3fb0", 600: "#4b52d1", 500: "#6269e6", 400: "#8a8ff0", 100: "#e6e7fc" },
        // Verdicts: holds, off by more than the tolerance, cannot be evaluated.
        holds: { 700: "#1f6b4a", 500: "#2f9e6e", 100: "#def5ea" },
        drift: { 700: "#8a4b00", 500: "#d98a1c", 100: "#fdf0d9" },
        void: { 700: "#8c1d3b", 500: "#c9415f", 100: "#fbe3ea" },
      },
      fontFamily: {
        sans: ['"Source Sans 3"', "system-ui", "sans-serif"],
        mono: ['"JetBrains Mono"', "ui-monospace", "monospace"],
      },
      fontSize: {
        "2xs": ["0.6875rem", { lineHeight: "1rem" }],
        xs: ["0.75rem", { lineHeight: "1.1rem" }],
        sm: ["0.875rem", { lineHeight: "1.3rem" }],
        base: ["1rem", { lineHeight: "1.55rem" }],
        lg: ["1.1875rem", { lineHeight: "1.75rem" }],
        xl: ["1.4375rem", { lineHeight: "2rem" }],
        "2xl": ["1.8125rem", { lineHeight: "2.3rem" }],
        "3xl": ["2.375rem", { lineHeight: "2.8rem" }],
      },
      spacing: { gutter: "1.5rem", rail: "18rem" },
      borderRadius: { chip: "0.3rem", panel: "0.6rem", sheet: "1rem" },
      boxShadow: { panel: "0 1px 2px rgb(11 16 32 / 0.06), 0 4px 16px rgb(11 16 32 / 0.06)" },
    },
  },
};

export default config;
