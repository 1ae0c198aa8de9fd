import localFont from 'next/font/local';

// Both families are open-licensed (SIL OFL 1.1, licence beside the files) and shipped in the repository,
// so nothing is fetched at build or run time.
export const displayFont = localFont({
  src: [
    { path: './fonts/fraunces/fraunces-latin-wght-normal.woff2', weight: '100 900', style: 'normal' },
    { path: './fonts/fraunces/fraunces-latin-ext-wght-normal.woff2', weight: '100 900', style: 'normal' },
  ],
  variable: '--font-display',
  display: 'swap',
});

export const textFont = localFont({
  src: [
    { path: './fonts/source-sans-3/source-sans-3-latin-wght-normal.woff2', weight: '200 900', style: 'normal' },
    { path: './fonts/source-sans-3/source-sans-3-latin-ext-wght-normal.woff2', weight: '200 900', style: 'normal' },
    { path: './fonts/source-sans-3/source-sans-3-latin-wght-italic.woff2', weight: '200 900', style: 'italic' },
  ],
  variable: '--font-text',
  display: 'swap',
});
