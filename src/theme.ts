import Aura from '@primeuix/themes/aura'
import { definePreset } from '@primeuix/themes'

// Fanlight's own palette: a deep harbour blue-green for structure, a lamp amber for emphasis.
export const FanlightPreset = definePreset(Aura, {
  semantic: {
    primary: {
      50: '#eef7f8', 100: '#d5ecef', 200: '#aad8de', 300: '#76bcc6', 400: '#4699a6',
      500: '#2a7b89', 600: '#1f6472', 700: '#1a505d', 800: '#16414c', 900: '#123b4a', 950: '#0a2630',
    },
    colorScheme: {
      light: {
        surface: {
          0: '#ffffff', 50: '#f7f8f6', 100: '#eef0ec', 200: '#dfe3dc', 300: '#c9cfc5', 400: '#a3ab9e',
          500: '#7d8678', 600: '#60695c', 700: '#4a5247', 800: '#343a32', 900: '#22271f', 950: '#141812',
        },
      },
    },
  },
})
