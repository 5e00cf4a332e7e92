import next from "eslint-config-next";
import layers from "./eslint-rules/layers.mjs";

// Layer rules (DEVELOPERS.md, "Layer rules"); tests/unit/lint/layer-rules.test.ts plants a
// violation of each and expects the lint step to fail.
const ENV_ONLY = "Only lib/server/env.ts reads process.env: add the variable to its schema and call getEnv().";
const envProperty = { object: "process", property: "env", message: ENV_ONLY };
const envImports = [
  { name: "process", importNames: ["env"], message: ENV_ONLY },
  { name: "node:process", importNames: ["env"], message: ENV_ONLY },
];
const PURE = "lib/analysis is pure: no I/O, clock, randomness or logging.";

const config = [
  { ignores: [".next/**", ".next-test/**", ".next-scale/**", "test-results/**", "node_modules/**", ".data/**", "bench-out/**", "next-env.d.ts", "db/migrations/**"] },
  ...next,
  {
    plugins: { emfolio: layers },
    rules: {
      "emfolio/db-client-only-in-queries": "error",
      "emfolio/no-db-in-ui": "error",
      "no-restricted-properties": ["error", envProperty],
      "no-restricted-imports": ["error", { paths: envImports }],
      "no-restricted-syntax": ["error", { selector: "MemberExpression[object.property.name='process'][property.name='env']", message: ENV_ONLY }],
    },
  },
  {
    // The pure analysis core: only its own files and three pure packages; no clock, randomness, logging or process.
    files: ["lib/analysis/**/*.{ts,tsx}"],
    rules: {
      "no-restricted-imports": ["error", {
        paths: envImports,
        patterns: [{ regex: "^(?!\\./|fft\\.js$|papaparse$|zod$)", message: `${PURE} It may import its own files, fft.js, papaparse and zod only.` }],
      }],
      "no-restricted-globals": ["error",
        ...["process", "console", "performance", "fetch", "crypto", "setTimeout", "setInterval", "setImmediate", "require", "XMLHttpRequest", "WebSocket", "localStorage"]
          .map((name) => ({ name, message: PURE })),
      ],
      "no-restricted-properties": ["error", envProperty,
        { object: "Math", property: "random", message: PURE },
        { object: "Date", property: "now", message: PURE },
        { object: "globalThis", message: PURE },
      ],
      "no-restricted-syntax": ["error",
        { selector: "MemberExpression[object.property.name='process'][property.name='env']", message: ENV_ONLY },
        { selector: "NewExpression[callee.name='Date'][arguments.length=0]", message: `${PURE} new Date() reads the clock.` },
        { selector: "CallExpression[callee.name='Date']", message: `${PURE} Date() reads the clock.` },
      ],
    },
  },
  {
    // The one reader of process.env; the standalone service fakes (not part of the app, their ports
    // come from flags) and the root tool configs, which run before any app module loads.
    files: ["lib/server/env.ts", "scripts/services/**", "scripts/drop-folder.mjs", "*.config.{ts,mjs}"],
    rules: { "no-restricted-properties": "off", "no-restricted-syntax": "off" },
  },
];

export default config;
