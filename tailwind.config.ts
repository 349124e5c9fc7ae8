import type { Config } from "tailwindcss";
import defaultTheme from "tailwindcss/defaultTheme";

/**
 * Ridgewright's own theme: "steel", a slightly cool grey like weathered galvanised sheet,
 * and one accent, "accent", a deep oxidised copper. Red/green/amber are kept only for states
 * (errors, active/inactive, cautions) and are never decoration.
 */
const steel = {
  50: "#f6f7f8",
  100: "#eceef0",
  200: "#d9dde1",
  300: "#bcc2c9",
  400: "#939ba5",
  500: "#737c87",
  600: "#5b636e",
  700: "#4a515a",
  800: "#3d434b",
  900: "#2b3036",
  950: "#1a1d21",
};

const accent = {
  50: "#fbf4ef",
  100: "#f5e3d6",
  200: "#ebc4a9",
  300: "#dd9d76",
  400: "#cd7a4f",
  500: "#b96236",
  600: "#9c4d28",
  700: "#7a3b1f",
  800: "#63311c",
  900: "#522a19",
  950: "#2e140b",
};

export default {
  content: ["./index.html", "./src/**/*.{ts,tsx}"],
  theme: {
    colors: {
      transparent: "transparent",
      current: "currentColor",
      white: "#ffffff",
      black: "#000000",
      steel,
      accent,
      danger: { 50: "#fdf3f2", 200: "#f3c7c2", 600: "#b42318", 700: "#912018" },
      ok: { 50: "#f0f8f3", 200: "#b9dfc6", 600: "#237a47", 700: "#1b5f37" },
      caution: { 50: "#fdf8ec", 200: "#f0d898", 700: "#8a5a07" },
    },
    extend: {
      fontFamily: {
        sans: ["Inter", ...defaultTheme.fontFamily.sans],
      },
      fontSize: {
        // compact desk-tool density: 13px body text, 12px secondary
        xs: ["0.75rem", { lineHeight: "1rem" }],
        sm: ["0.8125rem", { lineHeight: "1.25rem" }],
        base: ["0.875rem", { lineHeight: "1.375rem" }],
      },
      boxShadow: {
        panel: "0 1px 2px 0 rgb(26 29 33 / 0.06), 0 1px 3px 0 rgb(26 29 33 / 0.08)",
        overlay: "0 12px 32px -8px rgb(26 29 33 / 0.28), 0 2px 6px rgb(26 29 33 / 0.1)",
      },
      keyframes: {
        "slide-in": { from: { transform: "translateY(6px)", opacity: "0" }, to: { transform: "none", opacity: "1" } },
        progress: { from: { transform: "translateX(-100%)" }, to: { transform: "translateX(250%)" } },
      },
      animation: {
        "slide-in": "slide-in 140ms ease-out",
        progress: "progress 1.1s ease-in-out infinite",
      },
    },
  },
  plugins: [],
} satisfies Config;
