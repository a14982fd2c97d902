// ESLint (flat config): the boundaries DEVELOPERS.md writes down, checked. `npm run lint`; `npm test` runs it
// first. Untyped on purpose (no type information, so the whole tree lints in seconds).
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

import js from '@eslint/js';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import { importX } from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import tseslint from 'typescript-eslint';

const root = dirname(fileURLToPath(import.meta.url));
const featuresDir = join(root, 'web/src/features');
const features = readdirSync(featuresDir, { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);

// A web feature reaches another only through that feature's public index.ts (its own files are free).
const featureZones = features.flatMap((feature) =>
  features
    .filter((other) => other !== feature)
    .map((other) => ({
      target: `./web/src/features/${feature}`,
      from: `./web/src/features/${other}`,
      except: ['./index.ts'],
      message: `Import the ${other} feature through web/src/features/${other}/index.ts (its public surface).`,
    })),
);

const domainZone = {
  target: './api/src/domain',
  from: './api/src',
  except: ['./domain'],
  message: 'The domain imports nothing but zod and other domain files.',
};

// A colour literal: #rgb, #rgba, #rrggbb, #rrggbbaa, or rgb()/rgba()/hsl()/hsla().
const rawColour = String.raw`/^#(?:[0-9a-fA-F]{3,4}|[0-9a-fA-F]{6}|[0-9a-fA-F]{8})$|(?:rgba?|hsla?)\(/`;
const rawColourMessage =
  'No raw colours in components: use a Fluent theme token, or the shared marking palette (@drawings/marking-palette) for drawn ink.';

export default tseslint.config(
  {
    ignores: [
      '**/node_modules/**',
      '**/dist/**',
      '.data/**',
      'coverage/**',
      'drizzle/**',
      'templates/**/*.js',
      '**/*.d.ts',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'module',
      globals: {
        // Node and browser globals both appear (scripts, API, web app, tests); tsc checks their use.
        console: 'readonly',
        process: 'readonly',
        Buffer: 'readonly',
        URL: 'readonly',
        setTimeout: 'readonly',
        clearTimeout: 'readonly',
        setInterval: 'readonly',
        clearInterval: 'readonly',
      },
    },
    plugins: { 'import-x': importX },
    settings: {
      // import-x parses the files an import leads to (for no-cycle) with the TypeScript parser.
      'import-x/extensions': ['.ts', '.tsx', '.js', '.mjs'],
      'import-x/parsers': { '@typescript-eslint/parser': ['.ts', '.tsx'] },
      'import-x/resolver-next': [
        createTypeScriptImportResolver({
          project: ['api/tsconfig.json', 'web/tsconfig.json'],
          alwaysTryTypes: true,
          noWarnOnMultipleProjects: true,
        }),
      ],
    },
    rules: {
      // tsc already reports undefined names and unused code (noUnused* are off in tsconfig on purpose).
      'no-undef': 'off',
      '@typescript-eslint/no-unused-vars': 'off',
      '@typescript-eslint/no-explicit-any': 'off',
      '@typescript-eslint/no-empty-object-type': 'off',
      '@typescript-eslint/no-non-null-asserted-optional-chain': 'off',
      'no-empty': ['error', { allowEmptyCatch: true }],
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
      'import-x/no-self-import': 'error',
      'import-x/no-restricted-paths': ['error', { basePath: root, zones: [domainZone, ...featureZones] }],
    },
  },
  {
    files: ['web/src/**/*.ts', 'web/src/**/*.tsx'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
    },
  },
  {
    // A test may use another feature's test fixtures; the domain's boundary holds for tests too.
    files: ['**/*.spec.ts', '**/*.spec.tsx'],
    rules: {
      'import-x/no-restricted-paths': ['error', { basePath: root, zones: [domainZone] }],
    },
  },
  {
    // The domain is framework-free: zod and relative domain imports only (tests beside it may use their tools).
    files: ['api/src/domain/**/*.ts'],
    ignores: ['api/src/domain/**/*.spec.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex: String.raw`^(?!zod(?:/|$)|\.{1,2}/)`,
              message: 'The domain imports nothing but zod and other domain files.',
            },
          ],
        },
      ],
    },
  },
  {
    // Components take colours from the theme or the marking palette. Theme files (web/src/app/theme.ts, web/src/config/canvas-theme.ts,
    // web/src/config/brand.ts) and the palette are .ts, so this rule never sees them.
    files: ['web/src/**/*.tsx'],
    ignores: ['web/src/**/*.spec.tsx'],
    rules: {
      'no-restricted-syntax': [
        'error',
        { selector: `Literal[value=${rawColour}]`, message: rawColourMessage },
        { selector: `TemplateElement[value.raw=${rawColour}]`, message: rawColourMessage },
      ],
    },
  },
);
