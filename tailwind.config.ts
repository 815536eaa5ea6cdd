import type { Config } from 'tailwindcss'
import defaultTheme from 'tailwindcss/defaultTheme'

// Our palette: "ink" greys for text and structure, "tide" blue-green for actions,
// and distinct verdict colours that are always paired with words (never colour alone).
export default {
  content: [
    './app/**/*.{vue,ts}',
    './shared/**/*.ts'
  ],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"IBM Plex Sans"', ...defaultTheme.fontFamily.sans]
      },
      colors: {
        ink: {
          50: '#f5f7f8',
          100: '#e8ecef',
          200: '#cfd7dd',
          300: '#a9b6c0',
          400: '#7b8c99',
          500: '#5a6b78',
          600: '#455461',
          700: '#37434e',
          800: '#262f37',
          900: '#171d22'
        },
        tide: {
          50: '#eefaf8',
          100: '#d4f1ec',
          200: '#a9e2d9',
          300: '#72cbbf',
          400: '#3faea2',
          500: '#23918a',
          600: '#1a7472',
          700: '#185d5c',
          800: '#174a4a',
          900: '#143d3e'
        },
        verdict: {
          pass: '#1d6b3a',
          passbg: '#e6f4ea',
          fail: '#a3261c',
          failbg: '#fbe9e7',
          warn: '#8a5a00',
          warnbg: '#fdf3dc'
        }
      }
    }
  }
} satisfies Config
