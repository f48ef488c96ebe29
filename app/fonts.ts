import localFont from "next/font/local";

// Fonts ship with the app from npm font packages; nothing is fetched at build or run time.
export const sans = localFont({
  src: "../node_modules/@fontsource-variable/manrope/files/manrope-latin-wght-normal.woff2",
  variable: "--font-tautline-sans",
  weight: "200 800",
  display: "swap",
});

export const mono = localFont({
  src: [
    { path: "../node_modules/@fontsource/ibm-plex-mono/files/ibm-plex-mono-latin-400-normal.woff2", weight: "400" },
    { path: "../node_modules/@fontsource/ibm-plex-mono/files/ibm-plex-mono-latin-600-normal.woff2", weight: "600" },
  ],
  variable: "--font-tautline-mono",
  display: "swap",
});
