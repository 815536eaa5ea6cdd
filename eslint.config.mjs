// @ts-check
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['drizzle/**', '.data/**', '.output/**', 'test-results/**', '**/*.tmp.mjs']
  },
  {
    rules: {
      'vue/multi-word-component-names': 'off',
      // Up to three short attributes on one line; once an element wraps, one attribute per line.
      'vue/max-attributes-per-line': ['error', { singleline: { max: 3 }, multiline: { max: 1 } }],
      'vue/singleline-html-element-content-newline': 'off'
    }
  },
  {
    // Tests read JSON replies whose shape each assertion states.
    files: ['tests/**'],
    rules: {
      '@typescript-eslint/no-explicit-any': 'off'
    }
  }
)
