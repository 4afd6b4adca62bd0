// Lint rules for the project: typescript-eslint's recommended set, plus the 120-column width prettier also formats to.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['dist/', 'node_modules/', 'demo-data/releases/', 'bench/out/', 'test-artifacts/', 'out/', 'tmp/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { ecmaVersion: 2022, sourceType: 'module', globals: { console: 'readonly', process: 'readonly' } },
    rules: {
      // Long messages stay on one line so they can be found with grep; prettier breaks code.
      'max-len': [
        'error',
        { code: 120, ignoreStrings: true, ignoreTemplateLiterals: true, ignoreUrls: true, ignoreRegExpLiterals: true },
      ],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      // Finding and escaping control characters is part of checking catalogue values and IRIs.
      'no-control-regex': 'off',
    },
  },
  {
    // Tests edit parsed project files and JSON outputs freely.
    files: ['test/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    // The site's one script runs in the browser.
    files: ['src/site/assets/*.js'],
    languageOptions: {
      sourceType: 'script',
      globals: {
        document: 'readonly',
        navigator: 'readonly',
        fetch: 'readonly',
        window: 'readonly',
        location: 'readonly',
      },
    },
  },
);
