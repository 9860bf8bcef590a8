import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';
import prettier from 'eslint-config-prettier';

/** Repositories (*.repository.ts) are the only database boundary; the db folder holds the connection itself. */
const databaseBoundary = {
  files: ['server/src/**/*.ts'],
  ignores: ['server/src/**/*.repository.ts', 'server/src/db/**'],
  rules: {
    'no-restricted-syntax': [
      'error',
      ...['query', 'getRepository', 'createQueryBuilder'].map((method) => ({
        selector: `CallExpression[callee.property.name='${method}']`,
        message: `Database access (.${method}) belongs in a *.repository.ts file of the module.`,
      })),
    ],
  },
};

export default tseslint.config(
  { ignores: ['node_modules/**', 'dist/**', '.data/**', 'test-results/**', 'playwright-report/**'] },
  ...tseslint.configs.recommended,
  ...pluginVue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser } },
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/html-self-closing': 'off',
    },
  },
  databaseBoundary,
  // Lines stay within Prettier's 120 columns; Prettier does not break strings, so they may run on.
  {
    rules: {
      'max-len': [
        'error',
        {
          code: 120,
          ignoreStrings: true,
          ignoreTemplateLiterals: true,
          ignoreUrls: true,
          ignoreRegExpLiterals: true,
        },
      ],
    },
  },
  // Component tests define small host components beside the one they test.
  { files: ['tests/**/*.ts'], rules: { 'vue/one-component-per-file': 'off' } },
  // Layout is Prettier's (npm run format); eslint keeps to what it means.
  prettier,
);
