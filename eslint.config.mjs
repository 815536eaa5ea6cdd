// @ts-check
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['drizzle/**', '.data/**', '.output/**', 'test-results/**']
  },
  {
    rules: {
      'vue/multi-word-component-names': 'off',
      'vue/max-attributes-per-line': 'off',
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
