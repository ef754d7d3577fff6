import js from '@eslint/js';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', 'web/dist/', 'data/', 'coverage/', '**/*.py'] },
  js.configs.recommended,
  ...tseslint.configs.strict,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_' }],
    },
  },
  // The dashboard runs in the browser (its vite.config.ts in Node).
  { files: ['web/src/**/*.ts'], languageOptions: { globals: { ...globals.browser } } },
);
