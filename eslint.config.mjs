import js from '@eslint/js'
import tseslint from 'typescript-eslint'
import vue from 'eslint-plugin-vue'
import vueParser from 'vue-eslint-parser'

export default tseslint.config(
  { ignores: ['.nuxt/**', '.output/**', 'node_modules/**', '.data/**', 'test-results/**', 'playwright-report/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...vue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parser: vueParser, parserOptions: { parser: tseslint.parser, sourceType: 'module', extraFileExtensions: ['.vue'] } },
  },
  {
    languageOptions: { globals: { process: 'readonly', console: 'readonly', URL: 'readonly', fetch: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly', Buffer: 'readonly', performance: 'readonly', structuredClone: 'readonly' } },
    rules: {
      'no-undef': 'off', // TypeScript checks names; Nuxt auto-imports are globals
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
      'vue/multi-word-component-names': 'off',
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/html-self-closing': 'off',
      'vue/first-attribute-linebreak': 'off',
      'vue/html-closing-bracket-newline': 'off',
      'vue/multiline-html-element-content-newline': 'off',
    },
  },
  {
    // Every refusal carries a machine-readable code: the server throws apiError (server/utils/api-error.ts), never createError.
    // Imports climb no more than two folders: use Nuxt's aliases (#shared/..., ~~/server/...).
    files: ['server/**/*.ts'],
    ignores: ['server/utils/api-error.ts'],
    rules: {
      'no-restricted-syntax': ['error', { selector: "CallExpression[callee.name='createError']", message: 'Throw apiError(status, code, message) so the answer carries data.code.' }],
    },
  },
  {
    files: ['**/*.ts', '**/*.vue'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ regex: '^(\\.\\./){3,}', message: 'Use an alias (#shared/..., ~~/server/...) instead of climbing folders.' }] }],
    },
  },
)
