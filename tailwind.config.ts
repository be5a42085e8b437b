import type { Config } from "tailwindcss";

// Fuelwright's own palette: "ink" neutrals for a calm, printable screen, "copper" for action,
// and three signal colours that always come with a word and a symbol.
export default {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        ink: {
          50: "#f4f6f8",
          100: "#e6eaee",
          200: "#cdd4dc",
          300: "#a8b3bf",
          400: "#7b8896",
          500: "#5a6775",
          600: "#44505c",
          700: "#333d47",
          800: "#222a32",
          900: "#141a20",
        },
        copper: { 50: "#fbf3ee", 100: "#f4e0d3", 500: "#b3592c", 600: "#9a4a23", 700: "#7d3c1d" },
        ok: { 50: "#ecf7f3", 600: "#1f7a5a", 700: "#17603f" },
        caution: { 50: "#fdf6e3", 600: "#a56a00", 700: "#7f5200" },
        danger: { 50: "#fcefee", 600: "#b42d26", 700: "#8f231d" },
      },
      fontFamily: {
        sans: ["var(--font-body)", "system-ui", "sans-serif"],
        display: ["var(--font-display)", "var(--font-body)", "sans-serif"],
      },
    },
  },
} satisfies Config;
