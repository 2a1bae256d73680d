import type { Metadata, Viewport } from "next";
import localFont from "next/font/local";
import { connection } from "next/server";
import { Providers } from "@/components/providers";
import "./globals.css";

// Shipped with the app from the npm font package; nothing is fetched at build or run time.
const inter = localFont({
  src: "../node_modules/@fontsource-variable/inter/files/inter-latin-wght-normal.woff2",
  variable: "--font-inter",
  weight: "100 900",
  display: "swap",
});

export const metadata: Metadata = {
  title: { default: "Partproof", template: "%s · Partproof" },
  description: "Inspection, grading and lot decisions for an electronics spare-parts QC desk.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1 };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request, so each gets the nonce of its Content-Security-Policy
  // (proxy.ts); a page prerendered at build time would carry none and its scripts would not run.
  await connection();
  return (
    <html lang="en" className={inter.variable}>
      <body className="min-h-screen font-sans">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
