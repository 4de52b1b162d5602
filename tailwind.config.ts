import type { Config } from 'tailwindcss';

/**
 * Lossline's palette (docs/design.md, "Look"): warm paper, ink, one copper accent for destruction and
 * loss, teal for product exergy, amber for unsettled hours, slate for idle. State is never told by
 * colour alone: every state also has a label and a shape (src/components/HourStateBadge.tsx).
 */
export default {
  content: ['./src/**/*.{astro,html,js,jsx,ts,tsx,md}'],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#f7f3ea', deep: '#efe8d9', edge: '#ddd3bf' },
        ink: { DEFAULT: '#22201c', soft: '#4a463e', faint: '#7a7366' },
        copper: { DEFAULT: '#b5562a', deep: '#8e3f1c', pale: '#f3dccd' },
        teal: { DEFAULT: '#1f7a72', deep: '#155a54', pale: '#d3ebe7' },
        amber: { DEFAULT: '#c98a12', pale: '#f7e6bf' },
        slate: { DEFAULT: '#66707c', pale: '#e1e4e8' },
        alert: { DEFAULT: '#a3262a', pale: '#f5d6d4' },
      },
      fontFamily: {
        sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
      },
    },
  },
  plugins: [],
} satisfies Config;
