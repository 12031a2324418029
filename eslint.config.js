import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import pluginQuery from '@tanstack/eslint-plugin-query';
import fs from 'node:fs';

// The import boundaries of the client (DEVELOPERS.md, Conventions): a feature never imports another
// feature (pages in src/app/routes compose them), and shared components and the client library never
// import features.
const features = fs
  .readdirSync('src/features', { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);
// Toasts go through src/lib/toast.tsx (it loads the package on demand and places them per screen size).
// Every block of this rule for client files carries this ban, since a later block's options replace an
// earlier one's for the same file (flat config does not merge a rule's options).
const noSonner = [{ name: 'sonner', message: 'Show toasts through @/lib/toast, the one wrapper around sonner.', allowTypeImports: true }];
const restrict = (patterns, paths = noSonner) => ({ 'no-restricted-imports': ['error', { patterns, paths }] });
const boundaries = [
  { files: ['src/**/*.{ts,tsx}'], rules: restrict([]) },
  ...features.map((f) => ({
    files: [`src/features/${f}/**/*.{ts,tsx}`],
    rules: restrict([
      { regex: `^@/features/(?!${f}/)`, message: 'Features do not import each other: compose them in a page under src/app/routes.' },
      {
        regex: `^(\\.\\./)+(${features.filter((o) => o !== f).join('|')})/`,
        message: 'Features do not import each other: compose them in a page under src/app/routes.',
      },
    ]),
  })),
  // The layout (header, guards) is the app's frame and reads the session; the building blocks below it do not.
  {
    files: ['src/components/ui/**/*.{ts,tsx}', 'src/components/diff/**/*.{ts,tsx}', 'src/lib/**/*.{ts,tsx}'],
    rules: restrict([{ regex: '^@/features/', message: 'Shared components and the client library do not import features.' }]),
  },
  // The wrapper itself, and the phone's in-page list it loads, are the files that import the package.
  {
    files: ['src/lib/toast.tsx', 'src/lib/phone-toasts.tsx'],
    rules: restrict([{ regex: '^@/features/', message: 'Shared components and the client library do not import features.' }], []),
  },
  {
    files: ['server/**/*.{ts,tsx}'],
    rules: restrict(
      [{ regex: '^(\\.\\./)+src/(?!entry-server$)', message: 'The server draws pages through src/entry-server.tsx and imports nothing else from src/.' }],
      [],
    ),
  },
  {
    files: ['shared/**/*.ts'],
    rules: restrict(
      [{ regex: '^(@/|(\\.\\./)+(src|server)/)', message: 'shared/ is imported by both sides: it imports neither the client nor the server.' }],
      [],
    ),
  },
];

export default tseslint.config(
  { ignores: ['dist/', 'node_modules/', '.data/', '.test-artifacts/', 'coverage/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
    },
  },
  ...pluginQuery.configs['flat/recommended'],
  ...boundaries,
  {
    files: ['server/bin/*.mjs'],
    languageOptions: { globals: { process: 'readonly', console: 'readonly', Buffer: 'readonly', URL: 'readonly', setTimeout: 'readonly' } },
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
);
