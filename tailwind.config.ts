import type { Config } from "tailwindcss";

// Ecotone's own palette: deep reed green and warm heath ochre meeting over off-white
// paper, with one signal colour kept for problems. Text pairs below meet WCAG AA on
// paper; reed-900 and ink on paper meet AAA (field log main text).
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f8f5ec", deep: "#efe9da" },
        ink: { DEFAULT: "#1a1f1b", soft: "#3d463f" },
        reed: {
          50: "#eef5f0",
          100: "#d5e8dc",
          200: "#a9cfb7",
          300: "#76b08f",
          400: "#4a8e6b",
          500: "#2f7352",
          600: "#225c41",
          700: "#1b4a35",
          800: "#153a2a",
          900: "#0f2a1f",
        },
        heath: {
          50: "#fbf4e6",
          100: "#f5e3bf",
          200: "#ebc98a",
          300: "#dfab55",
          400: "#cf9030",
          500: "#b5761c",
          600: "#8f5a12",
          700: "#6e450f",
          800: "#53340d",
          900: "#3b250a",
        },
        signal: { DEFAULT: "#b3261e", soft: "#fbe9e7" },
      },
      fontFamily: {
        sans: ["var(--font-sans)", "system-ui", "sans-serif"],
      },
      minHeight: { touch: "48px" },
      minWidth: { touch: "48px" },
    },
  },
};

export default config;
