// ESLint flat config: Next.js core web vitals, typescript-eslint's type-checked recommended rules,
// and the rules of hooks as errors. `npm run lint` runs it; `npm test` runs it first.
import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import tseslint from "typescript-eslint";

const unsafeAnyRules = {
  "@typescript-eslint/no-unsafe-assignment": "off",
  "@typescript-eslint/no-unsafe-member-access": "off",
  "@typescript-eslint/no-unsafe-argument": "off",
  "@typescript-eslint/no-unsafe-call": "off",
  "@typescript-eslint/no-unsafe-return": "off",
};

export default tseslint.config(
  {
    ignores: [
      "node_modules/**",
      ".next/**",
      ".next-*/**",
      ".data/**",
      "test-results/**",
      "playwright-report/**",
      "tests/bench/out/**",
      "next-env.d.ts",
    ],
  },
  ...nextCoreWebVitals,
  ...tseslint.configs.recommendedTypeChecked,
  {
    languageOptions: {
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    rules: {
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "error",
      // `onSubmit={handleSubmit(save)}` and `onClick={async () => …}` are React's own idiom; promises
      // passed anywhere else (forEach, event emitters, timers) are still checked.
      "@typescript-eslint/no-misused-promises": ["error", { checksVoidReturn: { attributes: false } }],
      "@typescript-eslint/no-unused-vars": [
        "error",
        {
          argsIgnorePattern: "^_",
          varsIgnorePattern: "^_",
          destructuredArrayIgnorePattern: "^_",
          ignoreRestSiblings: true,
        },
      ],
    },
  },
  {
    // Knex rows are `any` (or `Record<string, unknown>` read with String()) until the tables are declared
    // for Knex (`knex/types/tables`) and JSON columns parsed with their schemas (issue 18 item 3).
    // The modules that read rows straight from Knex are listed here; take a folder off the list when its
    // queries are typed. Everything else in the project is checked with the unsafe-`any` rules on.
    files: ["lib/data/**", "lib/review/**", "lib/requests/**", "lib/mail/**", "app/api/**", "db/**"],
    rules: { ...unsafeAnyRules, "@typescript-eslint/no-base-to-string": "off" },
  },
  {
    // Tests read JSON answers (`await res.json()` is `any`) and check them with `expect`.
    files: ["tests/**"],
    rules: unsafeAnyRules,
  },
  {
    files: ["**/*.mjs", "**/*.js", "**/*.cjs"],
    ...tseslint.configs.disableTypeChecked,
  },
);
