import { definePreset } from '@primeuix/themes';
import Aura from '@primeuix/themes/aura';

/**
 * Ingotrace's own look: a deep "anodised teal" primary with a warm brass accent used sparingly
 * for cautions, on cool slate surfaces. Built on PrimeVue's Aura structure, with our palette.
 */
export const IngotracePreset = definePreset(Aura, {
  primitive: {
    borderRadius: { none: '0', xs: '2px', sm: '3px', md: '5px', lg: '7px', xl: '10px' },
  },
  semantic: {
    primary: {
      50: '#eef7f8',
      100: '#d3ebee',
      200: '#a9d6dc',
      300: '#74b9c3',
      400: '#4596a3',
      500: '#2a7b89',
      600: '#1f6471',
      700: '#17505f',
      800: '#12404c',
      900: '#0d313a',
      950: '#071e24',
    },
    colorScheme: {
      light: {
        surface: {
          0: '#ffffff',
          50: '#f6f8f9',
          100: '#eceff1',
          200: '#dde2e6',
          300: '#c5ccd2',
          400: '#9aa5ae',
          500: '#727f8a',
          600: '#56626c',
          700: '#414b54',
          800: '#2b333a',
          900: '#1b2126',
          950: '#0f1316',
        },
      },
    },
  },
});
