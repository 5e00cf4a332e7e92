import type { Config } from "tailwindcss";

// Emfolio palette: "slate ink" neutrals, a copper accent (windings), and status hues
// chosen to stay distinguishable for red-green colour blindness (icons and words too).
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        ink: { 50: "#f5f7f8", 100: "#e7ecee", 200: "#cfd8dc", 400: "#7f909a", 600: "#4a5a63", 800: "#243139", 900: "#141c21" },
        copper: { 50: "#fbf3ec", 100: "#f4e0cf", 400: "#d08a52", 600: "#a85c26", 700: "#86461a" },
        within: { 100: "#dcefe9", 700: "#17695a" },
        edge: { 100: "#fbeccb", 700: "#8a5a00" },
        outside: { 100: "#f8dedd", 700: "#a3242a" },
      },
      fontFamily: { sans: ["var(--font-inter)", "system-ui", "sans-serif"] },
    },
  },
};

export default config;
