// Kilowright's design tokens: warm paper, graphite text, copper for
// action and production, slate blue for usage, sage for success. Loaded by src/app/globals.css.
// Every text colour reads at 4.5:1 or more (WCAG 2.2 SC 1.4.3) on white, paper, paper-deep and
// the light tints; tests/browser/axe.spec.ts checks every screen with axe-core.
import type { Config } from "tailwindcss";

const config: Config = {
  content: ["./src/**/*.{ts,tsx}", "./emails/**/*.tsx"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#FAF7F2", deep: "#F1EBE1", line: "#E2D9CB" },
        graphite: { DEFAULT: "#1F2933", soft: "#52606D", faint: "#606973" },
        copper: { DEFAULT: "#9D4927", dark: "#7A3519", light: "#F3DCCF" },
        sage: { DEFAULT: "#4B6858", light: "#DDE8E1" },
        slate: { usage: "#3E5C76", light: "#DCE4EC" },
        production: "#B5542D",
        usage: "#3E5C76",
        danger: { DEFAULT: "#A23B3B", light: "#F5DEDE" },
        caution: { DEFAULT: "#815A0F", light: "#F6EAD0" },
      },
      fontFamily: {
        sans: ['"IBM Plex Sans"', "system-ui", "sans-serif"],
        mono: ['"IBM Plex Mono"', "ui-monospace", "monospace"],
      },
      spacing: { touch: "44px" },
      minHeight: { touch: "44px" },
      minWidth: { touch: "44px" },
      borderRadius: { card: "10px" },
      boxShadow: { card: "0 1px 2px rgba(31,41,51,0.06), 0 1px 1px rgba(31,41,51,0.04)" },
    },
  },
};

export default config;
