import { definePreset } from '@primeuix/themes';
import Aura from '@primeuix/themes/aura';

/**
 * Ingotrace's own look: a deep "anodised teal" primary with a warm brass accent used sparingly
 * for cautions, on cool slate surfaces. Built on PrimeVue's Aura structure, with our palette.
 */
export const IngotracePreset = definePreset(Aura, {
  primitive: {
    borderRadius: { none: '0', xs: '2px', sm: '3px', md: '5px', lg: '7px', xl: '10px' },
    // Danger text and buttons at ≥ 4.5:1 on white and on the light surfaces (WCAG 2.1 SC 1.4.3).
    red: { 500: '#c62828', 600: '#b91c1c' },
    // Success text and buttons likewise (green 700 of the same family).
    green: { 500: '#15803d', 600: '#166534' },
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
          // Muted text, placeholders, inactive tabs: ≥ 4.5:1 on white and on surface 50 and 100 (WCAG 2.1 SC 1.4.3).
          500: '#5f6b75',
          600: '#56626c',
          700: '#414b54',
          800: '#2b333a',
          900: '#1b2126',
          950: '#0f1316',
        },
      },
    },
  },
  components: {
    // The caution banner's text at ≥ 4.5:1 on its pale brass background.
    message: { colorScheme: { light: { warn: { color: '#7a4b00' }, secondary: { color: '{surface.700}' } } } },
  },
});
