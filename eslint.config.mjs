import js from '@eslint/js'
import tseslint from 'typescript-eslint'
import vue from 'eslint-plugin-vue'
import vueParser from 'vue-eslint-parser'

const NO_CREATE_ERROR = { selector: "CallExpression[callee.name='createError']", message: 'Throw apiError(status, code, message) so the answer carries data.code.' }
const NO_SESSION_CALLS = {
  selector: "CallExpression[callee.name=/^(getUserSession|setUserSession|replaceUserSession|clearUserSession|requireUserSession)$/]",
  message: 'Use readSession / writeSession / endSession (server/utils/session.ts).',
}

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
    // Sessions go through server/utils/session.ts: it picks the cookie name (__Host- over HTTPS) and never answers a
    // request that only reads the session with a fresh cookie.
    files: ['server/**/*.ts'],
    ignores: ['server/utils/api-error.ts', 'server/utils/session.ts'],
    rules: {
      'no-restricted-syntax': ['error', NO_CREATE_ERROR, NO_SESSION_CALLS],
    },
  },
  { files: ['server/utils/session.ts'], rules: { 'no-restricted-syntax': ['error', NO_CREATE_ERROR] } },
  {
    files: ['**/*.ts', '**/*.vue'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ regex: '^(\\.\\./){3,}', message: 'Use an alias (#shared/..., ~~/server/...) instead of climbing folders.' }] }],
    },
  },
  {
    // Code that can run in the browser takes zod from #shared/zod (no code generation under the CSP).
    files: ['pages/**/*.{ts,vue}', 'components/**/*.{ts,vue}', 'composables/**/*.ts', 'utils/**/*.ts', 'stores/**/*.ts', 'shared/**/*.ts', 'layouts/**/*.vue', 'middleware/**/*.ts', 'plugins/**/*.ts', '*.vue'],
    ignores: ['shared/zod.ts'],
    rules: {
      'no-restricted-imports': 'off',
      '@typescript-eslint/no-restricted-imports': ['error', {
        paths: [{ name: 'zod', message: "Import { z } from '#shared/zod' (it turns off zod's code generation in the browser).", allowTypeImports: true }],
        patterns: [{ regex: '^(\\.\\./){3,}', message: 'Use an alias (#shared/..., ~~/server/...) instead of climbing folders.' }],
      }],
    },
  },
)
