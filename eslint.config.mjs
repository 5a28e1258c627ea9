import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

/** The arrows run app → components → lib → db (DEVELOPERS.md, "Where things live"). */
const NO_APP = { group: ["@/app/*", "**/app/*"], message: "Only routes import from app/: pass a server action down as a prop, or move the component beside its route (_components/)." };

const config = [
  ...nextVitals,
  ...nextTs,
  {
    ignores: [".next*/**", ".worker/**", "node_modules/**", "data/**", "db/migrations/**", "next-env.d.ts"],
  },
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "separate-type-imports" }],
      // Under verbatimModuleSyntax an import whose names are all types must say so whole (`import type`), or the module still loads.
      "@typescript-eslint/no-import-type-side-effects": "error",
      // TanStack Table v8 returns fresh functions by design; the compiler's notice is not a defect.
      "react-hooks/incompatible-library": "off",
    },
  },
  {
    files: ["components/**", "lib/**"],
    rules: { "@typescript-eslint/no-restricted-imports": ["error", { patterns: [NO_APP] }] },
  },
  {
    // Queries live only in db/queries/ (the seed and the scripts set data up directly; tests check it).
    files: ["components/**", "lib/**"],
    ignores: ["lib/seed/**", "lib/scripts/**", "**/*.test.ts", "**/*.test.tsx"],
    rules: {
      "@typescript-eslint/no-restricted-imports": [
        "error",
        { patterns: [NO_APP], paths: [{ name: "drizzle-orm", message: "Build queries in db/queries/ and call them from lib/." }] },
      ],
    },
  },
  {
    files: ["db/**"],
    rules: {
      "@typescript-eslint/no-restricted-imports": [
        "error",
        { patterns: [NO_APP, { group: ["@/lib/*", "**/lib/*"], allowTypeImports: true, message: "db/ takes only types from lib/ (import type { … }); the rule or computation belongs in lib/, called by the door." }] },
      ],
    },
  },
  {
    // Type-aware checks where a slip costs most: promises left floating or handed where nothing awaits them.
    files: ["**/*.ts", "**/*.tsx"],
    languageOptions: { parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname } },
    rules: {
      "@typescript-eslint/no-floating-promises": "error",
      "@typescript-eslint/no-misused-promises": ["error", { checksVoidReturn: { attributes: false } }],
      "@typescript-eslint/await-thenable": "error",
      "@typescript-eslint/switch-exhaustiveness-check": ["error", { considerDefaultExhaustiveForUnions: true }],
    },
  },
];

export default config;
