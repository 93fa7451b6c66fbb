import type { Config } from 'tailwindcss';

/**
 * Emberline's visual identity: warm paper, charcoal ink, an ember accent for heat and a deep
 * teal for water. Every text/background pair used in the app meets WCAG AA (4.5:1 for body text);
 * the ratios are noted beside the colours against `paper` (#FBF7F1).
 */
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './analysis/**/*.ts'],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#FBF7F1', deep: '#F3ECE2', line: '#E4D9CB' },
        ink: { DEFAULT: '#1F1A17' /* 16.3:1 */, soft: '#4A403A' /* 9.6:1 */, muted: '#6B5E55' /* 5.8:1 */ },
        coal: { DEFAULT: '#241E1B', raised: '#342B26', line: '#4A3F38' },
        ember: {
          50: '#FFF4EC',
          100: '#FFE3CC',
          200: '#FCC79F',
          300: '#F8A066',
          400: '#F07F35',
          500: '#DE6316',
          600: '#B84E0C' /* 5.0:1 on paper */,
          700: '#93400D' /* 7.2:1 */,
          800: '#6E3110',
          900: '#4A220C',
        },
        water: { 50: '#EAF6F6', 100: '#CBE9EA', 400: '#2C9AA0', 600: '#0F6E73' /* 5.6:1 */, 800: '#0A4A4D' },
        caution: { bg: '#FFF6DB', line: '#E9C46A', text: '#7A4B00' /* 7.3:1 on its bg */ },
        danger: { bg: '#FDECEA', line: '#E8A29B', text: '#9B1C13' /* 7.1:1 */ },
        ok: { bg: '#EAF5EA', text: '#2C6B2F' /* 5.9:1 */ },
      },
      fontFamily: {
        sans: ['"Inter"', 'ui-sans-serif', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'SFMono-Regular', 'monospace'],
      },
      fontSize: {
        // A 1.2 modular scale from 16 px, line heights tuned for reading values at arm's length.
        xs: ['0.75rem', { lineHeight: '1.1rem' }],
        sm: ['0.875rem', { lineHeight: '1.3rem' }],
        base: ['1rem', { lineHeight: '1.55rem' }],
        lg: ['1.2rem', { lineHeight: '1.75rem' }],
        xl: ['1.44rem', { lineHeight: '2rem' }],
        '2xl': ['1.728rem', { lineHeight: '2.25rem', letterSpacing: '-0.01em' }],
        '3xl': ['2.074rem', { lineHeight: '2.5rem', letterSpacing: '-0.015em' }],
        '4xl': ['2.488rem', { lineHeight: '2.9rem', letterSpacing: '-0.02em' }],
      },
      borderRadius: { card: '0.75rem' },
      boxShadow: {
        card: '0 1px 0 rgba(36,30,27,0.04), 0 1px 3px rgba(36,30,27,0.08)',
        lift: '0 6px 24px -8px rgba(36,30,27,0.25)',
      },
      maxWidth: { page: '72rem' },
    },
  },
};

export default config;
