import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  {
    ignores: [".next*/**", ".worker/**", "node_modules/**", "data/**", "db/migrations/**", "next-env.d.ts"],
  },
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
      // TanStack Table v8 returns fresh functions by design; the compiler's notice is not a defect.
      "react-hooks/incompatible-library": "off",
    },
  },
];

export default config;
