import type { Config } from "tailwindcss";

/**
 * Kalibore's palette: paper and ink for contrast in a dim engine room or on a
 * glare-washed tablet; one accent ("signal") for actions; caution and limit colours
 * reserved for wear limits and always paired with words or an icon.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f6f5f1", raised: "#ffffff", sunk: "#ebe9e2" },
        ink: { DEFAULT: "#111720", soft: "#3a4350", faint: "#4d5561", line: "#c9c6bc" },
        signal: { DEFAULT: "#0a5c73", strong: "#07465a", tint: "#dcecef" },
        steady: { DEFAULT: "#1f6b3a", tint: "#e1efe4" },
        caution: { DEFAULT: "#8a5300", tint: "#fbefd6" },
        limit: { DEFAULT: "#a3161b", tint: "#f8dedd" },
        night: { DEFAULT: "#0d1319", raised: "#161e27" },
      },
      fontFamily: {
        sans: ["var(--font-sans)", "system-ui", "sans-serif"],
        mono: ["var(--font-mono)", "ui-monospace", "monospace"],
      },
    },
  },
};

export default config;
