import nextVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTypescript,
  {
    ignores: [".next/**", "node_modules/**", "data/**", "next-env.d.ts", "tests/e2e/artifacts/**"],
  },
  {
    rules: {
      // process.env is read in one validated module only (STYLE habit 10).
      "no-restricted-properties": [
        "error",
        { object: "process", property: "env", message: "Read settings through lib/env.ts." },
      ],
    },
  },
  {
    files: ["lib/env.ts", "next.config.mjs", "vitest.config.ts", "tests/**"],
    rules: { "no-restricted-properties": "off" },
  },
];

export default config;
