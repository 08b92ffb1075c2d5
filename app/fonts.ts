import localFont from "next/font/local";

// Shipped inside the app (SIL Open Font License, see fonts/IBM-Plex-Sans-LICENSE.txt): no network at
// build or run time, and next/font sizes the fallback so the swap causes no layout shift.
export const plexSans = localFont({
  src: [
    { path: "./fonts/ibm-plex-sans-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/ibm-plex-sans-latin-500-normal.woff2", weight: "500", style: "normal" },
    { path: "./fonts/ibm-plex-sans-latin-600-normal.woff2", weight: "600", style: "normal" },
  ],
  variable: "--font-plex",
  display: "swap",
  fallback: ["system-ui", "sans-serif"],
});
