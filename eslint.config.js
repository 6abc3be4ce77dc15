// @ts-check
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import astro from 'eslint-plugin-astro';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/', '.astro/', '.data/', 'node_modules/', 'local-s3/data/', 'db/migrations/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...astro.configs.recommended,
  {
    files: ['**/*.{ts,tsx,mjs,js}'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
  },
  {
    files: ['src/components/**/*.tsx'],
    plugins: { 'react-hooks': reactHooks },
    rules: reactHooks.configs.recommended.rules,
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    // The production server hands a small JSON body to the routes as text (scripts/serve.mjs), not as
    // the request's stream: read bodies through parseJson/parseBody (lib/server/http.ts).
    files: ['src/**/*.{ts,astro}'],
    ignores: ['src/lib/server/http.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        ...["[callee.object.name='request']", "[callee.object.property.name='request']"].map((request) => ({
          selector: `CallExpression[callee.property.name=/^(json|text|arrayBuffer|blob|bytes)$/]${request}`,
          message: 'Read a JSON body with parseJson or parseBody (lib/server/http.ts): the production server may have read it ahead.',
        })),
      ],
    },
  },
  {
    // Tests read JSON answers whose shape is what they check.
    files: ['tests/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
);
