import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      // A leading underscore marks a parameter kept for its position (server action signatures).
      "@typescript-eslint/no-unused-vars": [
        "warn",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_" },
      ],
      // We do not run the React Compiler; this rule only reports that it would skip TanStack Table.
      "react-hooks/incompatible-library": "off",
    },
  },
  {
    files: ["app/**/*.tsx", "components/**/*.tsx"],
    ignores: ["components/ui/intent-link.tsx"],
    rules: {
      // A plain Link prefetches its page as soon as it is drawn: a table of fifty rows fetched fifty
      // pages at load and kept each screen busy. Links fetch on intent instead.
      "no-restricted-imports": [
        "error",
        {
          paths: [
            {
              name: "next/link",
              message: "Use IntentLink from @/components/ui/intent-link: it prefetches on intent.",
            },
          ],
        },
      ],
    },
  },
  {
    ignores: [
      ".next/**",
      "node_modules/**",
      "db/migrations/**",
      "next-env.d.ts",
      "playwright-report/**",
      "test-results/**",
    ],
  },
];

export default config;
