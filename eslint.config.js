// ESLint flat config. The import zones enforce HOUSE.md's one-way dependencies:
// src → shared ← server ← scripts; inside the client app → features → components/lib,
// and no feature imports another; inside the server, server/lib is a leaf and no module
// reaches into another module's repository (HOUSE.md 8a: each table has one owner, whose
// service or index.ts the others call).
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import importPlugin from "eslint-plugin-import";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import { readdirSync, existsSync } from "node:fs";

const features = existsSync("src/features") ? readdirSync("src/features") : [];
const serverModules = existsSync("server/modules") ? readdirSync("server/modules") : [];

export default tseslint.config(
  { ignores: ["dist/**", "node_modules/**", ".data/**", "coverage/**", "public/**"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,js,mjs}"],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { import: importPlugin, "react-hooks": reactHooks },
    settings: {
      "import/resolver": { typescript: { project: "./tsconfig.json" }, node: true },
      "import/parsers": { "@typescript-eslint/parser": [".ts", ".tsx"] },
    },
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "warn",
      "import/no-cycle": ["error", { maxDepth: 10 }],
      "import/no-restricted-paths": [
        "error",
        {
          zones: [
            {
              target: "./shared",
              from: ["./src", "./server", "./scripts", "./tests"],
              message: "shared/ is pure: it imports only zod and shared/.",
            },
            { target: "./src", from: ["./server", "./scripts"], message: "The client never imports server code." },
            {
              target: "./server",
              from: ["./src", "./scripts"],
              message: "The server never imports client code or scripts.",
            },
            {
              target: "./src/components",
              from: ["./src/features", "./src/app"],
              message: "components/ are shared building blocks: no feature or app imports.",
            },
            { target: "./src/lib", from: ["./src/features", "./src/app", "./src/components"] },
            { target: "./src/features", from: ["./src/app"], message: "Features do not import the app layer." },
            {
              target: "./server/lib",
              from: [
                "./server/modules",
                "./server/middleware",
                "./server/jobs",
                "./server/app.ts",
                "./server/routes.ts",
              ],
              message: "server/lib is a leaf: it imports no module, middleware or job.",
            },
            {
              target: ["./server/middleware", "./server/jobs", "./server/db"],
              from: "./server/modules/*/*.repository.ts",
              message: "Only a table's owning module uses its repository; call the module's service or index.ts.",
            },
            ...serverModules.map((m) => ({
              target: `./server/modules/${m}`,
              from: serverModules.filter((o) => o !== m).map((o) => `./server/modules/${o}/*.repository.ts`),
              message:
                "No module imports another module's repository: call the owner's service or index.ts (README, who owns which table).",
            })),
            ...features.map((f) => ({
              target: `./src/features/${f}`,
              from: "./src/features",
              except: [`./${f}`],
              message: "No feature imports another; compose them in src/app.",
            })),
          ],
        },
      ],
    },
  },
  {
    files: ["tests/**", "scripts/**"],
    rules: { "@typescript-eslint/no-non-null-assertion": "off" },
  },
);
