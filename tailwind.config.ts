import type { Config } from 'tailwindcss'

// Tidewell palette: deep ink blue for structure, warm sand backgrounds, sea-glass green
// for success; danger red and amber are kept for the Emergency and Urgent levels only.
export default {
  content: [
    './app.vue',
    './components/**/*.vue',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './composables/**/*.ts',
  ],
  theme: {
    extend: {
      colors: {
        ink: {
          50: '#eef1f7',
          100: '#d6dceb',
          300: '#8d9bc0',
          500: '#3b4f80',
          700: '#22325a',
          800: '#1a2748',
          900: '#111b35',
        },
        sand: {
          50: '#fcf9f3',
          100: '#f7f0e3',
          200: '#eee2cb',
          300: '#e0ceac',
        },
        seaglass: {
          100: '#dcefe9',
          600: '#2d7565',
          700: '#215a4d',
        },
        emergency: {
          50: '#fdecea',
          700: '#a4161a',
          800: '#7f1014',
        },
        urgent: {
          50: '#fdf3dc',
          300: '#f1c25b',
          800: '#6b4300',
        },
      },
      fontFamily: {
        sans: ['"Atkinson Hyperlegible"', 'system-ui', 'sans-serif'],
      },
      fontSize: {
        base: ['1.125rem', { lineHeight: '1.65' }],
      },
      minHeight: { tap: '44px' },
      minWidth: { tap: '44px' },
    },
  },
  plugins: [],
} satisfies Config
