import type { Config } from 'tailwindcss';
import { PALETTE } from './src/lib/palette';

/**
 * Lossline's palette (docs/design.md, "Look"): warm paper, ink, one copper accent for destruction and
 * loss, teal for product exergy, amber for unsettled hours, slate for idle. State is never told by
 * colour alone: every state also has a label and a shape. The colours are defined once in
 * src/lib/palette.ts (with their contrast on every background).
 */
export default {
  content: ['./src/**/*.{astro,html,js,jsx,ts,tsx,md}'],
  theme: {
    extend: {
      colors: PALETTE,
      fontFamily: {
        sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
      },
    },
  },
  plugins: [],
} satisfies Config;
