import type { Config } from "tailwindcss";

/**
 * Layerwright's own palette: warm "paper" greys for surfaces, a deep "ink" for text, a burnt
 * "kiln" orange for actions (the colour of a freshly laid bead) and a "tide" teal for states.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./emails/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { 50: "#fbfaf7", 100: "#f4f1ea", 200: "#e8e3d7", 300: "#d6cfbf" },
        ink: { 400: "#5f6874", 500: "#4d5662", 600: "#353d47", 700: "#242b33", 800: "#181d23", 900: "#0f1317" },
        kiln: { 50: "#fdf2ea", 100: "#fadfcb", 400: "#e98a4c", 500: "#d9692a", 600: "#b9531d", 700: "#93401a" },
        tide: { 50: "#ecf6f5", 100: "#cfe9e6", 500: "#2c8a83", 600: "#22706a", 700: "#1b5853" },
        signal: { warn: "#8a5a0b", danger: "#b42318", ok: "#2f7a3d" },
      },
      fontFamily: {
        sans: ["var(--font-inter)", "ui-sans-serif", "system-ui", "sans-serif"],
        mono: ["ui-monospace", "SFMono-Regular", "Menlo", "monospace"],
      },
      fontSize: {
        // A 1.2 type scale from a 15 px body.
        xs: ["0.75rem", { lineHeight: "1.1rem" }],
        sm: ["0.8125rem", { lineHeight: "1.25rem" }],
        base: ["0.9375rem", { lineHeight: "1.5rem" }],
        lg: ["1.125rem", { lineHeight: "1.6rem" }],
        xl: ["1.35rem", { lineHeight: "1.8rem" }],
        "2xl": ["1.62rem", { lineHeight: "2.05rem" }],
        "3xl": ["1.94rem", { lineHeight: "2.3rem" }],
        "4xl": ["2.33rem", { lineHeight: "2.6rem" }],
        "5xl": ["2.8rem", { lineHeight: "3rem" }],
      },
      borderRadius: { DEFAULT: "0.3rem" },
    },
  },
};

export default config;
