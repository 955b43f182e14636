// Tailwind 4 reads its theme from CSS (`@theme` in src/styles.css); this file only records
// where the classes live and how dark mode is switched, for tools that still look for it.
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  darkMode: 'class',
};
