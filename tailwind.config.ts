import type { Config } from 'tailwindcss';

/**
 * Porewise design tokens. This file is the one place colours, type and radii live.
 *
 * Roles
 * - ink: cool grey-slate neutrals for text, borders and surfaces (light theme first).
 *   Body text ink-900, secondary text ink-600, units/hints ink-500 (≥ 4.5:1 on white and ink-50),
 *   borders ink-200/300, page background ink-50.
 * - primary: deep, slightly blue-green "filtrate" hue for actions and focus.
 *   White text on primary-600 is 6.5:1, on primary-700 8.6:1.
 * - accent: muted garnet for the brand mark and rare highlights. Never used for errors.
 *
 * Status (ok / watch / stop)
 * Always paired with a word and an icon; colour only supports them. The trio is chosen so it
 * stays apart for the common colour-vision deficiencies:
 * - ok    = mid blue  (#2a6fb8), on the blue side of the blue–yellow axis that protanopia
 *           and deuteranopia keep;
 * - watch = amber     (#d19a1f), the light, yellow end of that axis;
 * - stop  = crimson leaning to magenta (#b01e46), darker than watch and redder than ok.
 * Simulated (Machado 2009, full severity) CIELAB distances between the 500/600 shades stay
 * ≥ 44 for every pair under protanopia, deuteranopia and tritanopia (normal vision ≥ 75).
 * Text shades (ok-700, watch-800, stop-700) reach ≥ 7:1 on their own 50 background.
 * Green is deliberately not used for "ok", so red/green confusion cannot arise.
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    // Six steps only; weights 400 and 600.
    fontSize: {
      xs: ['0.75rem', { lineHeight: '1rem' }], // 12 px: table meta, captions
      sm: ['0.875rem', { lineHeight: '1.25rem' }], // 14 px: tables, hints, labels
      base: ['1rem', { lineHeight: '1.5rem' }], // 16 px: body, inputs
      lg: ['1.25rem', { lineHeight: '1.75rem' }], // 20 px: section headings
      xl: ['1.625rem', { lineHeight: '2rem' }], // 26 px: page titles
      '2xl': ['2.25rem', { lineHeight: '2.5rem' }], // 36 px: the one number that matters now
    },
    fontWeight: {
      normal: '400',
      semibold: '600',
    },
    extend: {
      colors: {
        ink: {
          50: '#f6f8f9',
          100: '#eceff2',
          200: '#d9dfe4',
          300: '#bcc5cd',
          400: '#93a0ab',
          500: '#65727e',
          600: '#56636e',
          700: '#444f59',
          800: '#333c44',
          900: '#232a30',
          950: '#151a1e',
        },
        primary: {
          50: '#eef7f8',
          100: '#d4ecee',
          200: '#acd8dd',
          300: '#78bcc4',
          400: '#4699a4',
          500: '#2b7d89',
          600: '#1f6673',
          700: '#1b535e',
          800: '#19444d',
          900: '#163940',
          950: '#0c2429',
        },
        accent: {
          50: '#faf3f4',
          100: '#f3e3e6',
          200: '#e6c6cc',
          300: '#d29ea8',
          400: '#b8717f',
          500: '#9d4f5f',
          600: '#843d4c',
          700: '#6d323f',
          800: '#5a2b35',
          900: '#4a252d',
        },
        ok: {
          50: '#eff5fc',
          100: '#dbe8f7',
          200: '#b8d1ee',
          400: '#5590cd',
          500: '#2a6fb8',
          600: '#225c9c',
          700: '#1d4b80',
          800: '#193e69',
        },
        watch: {
          50: '#fdf7ea',
          100: '#faecc9',
          200: '#f3d893',
          400: '#e0ab34',
          500: '#d19a1f',
          600: '#ae7b12',
          700: '#8a5f0f',
          800: '#6e4b10',
        },
        stop: {
          50: '#fcf1f4',
          100: '#f8dfe6',
          200: '#f0bccb',
          400: '#d0577b',
          500: '#c23359',
          600: '#b01e46',
          700: '#8f183a',
          800: '#721632',
        },
      },
      fontFamily: {
        sans: [
          '"Source Sans 3"',
          'system-ui',
          '-apple-system',
          '"Segoe UI"',
          'Roboto',
          '"Helvetica Neue"',
          'Arial',
          'sans-serif',
        ],
      },
      borderRadius: {
        sm: '4px',
        DEFAULT: '6px',
        md: '6px',
      },
      backgroundImage: {
        // Quiet hatched edge that marks safety cautions (watch-400 on watch-100).
        'caution-stripe': 'repeating-linear-gradient(135deg, #e0ab34 0 5px, #faecc9 5px 10px)',
      },
      boxShadow: {
        // Rare: only floating layers (dialog, toast).
        float: '0 8px 24px -8px rgb(21 26 30 / 0.25)',
      },
      minHeight: {
        touch: '44px',
      },
      minWidth: {
        touch: '44px',
      },
    },
  },
} satisfies Config;
