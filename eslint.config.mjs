import nextVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTypescript,
  {
    ignores: [".next/**", "node_modules/**", "data/**", "next-env.d.ts", "tests/e2e/artifacts/**"],
  },
  {
    settings: { next: { rootDir: "." } },
    rules: {
      "@next/next/no-html-link-for-pages": "off",
      // process.env is read in one validated module only (STYLE habit 10).
      "no-restricted-properties": [
        "error",
        { object: "process", property: "env", message: "Read settings through lib/env.ts." },
      ],
    },
  },
  {
    // lib/cli/demo.ts hands the environment on to the app it starts; tests set up child processes.
    files: ["lib/env.ts", "next.config.mjs", "vitest.config.mts", "tests/**", "lib/cli/demo.ts"],
    rules: { "no-restricted-properties": "off" },
  },
];

export default config;
