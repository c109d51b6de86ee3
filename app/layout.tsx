import type { Metadata } from "next";
import "@fontsource/source-sans-3/400.css";
import "@fontsource/source-sans-3/600.css";
import "@fontsource/source-sans-3/700.css";
import "@fontsource/jetbrains-mono/400.css";
import "@fontsource/jetbrains-mono/600.css";
import "./globals.css";
import { SiteHeader } from "@/components/site-header";

export const metadata: Metadata = {
  title: { default: "VisViva", template: "%s · VisViva" },
  description: "Design review boards for spacecraft mission proposals, with every orbit claim recomputed on the server.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en">
      <body className="min-h-screen font-sans">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:bg-paper focus:px-3 focus:py-2">
          Skip to content
        </a>
        <SiteHeader />
        <main id="main" className="mx-auto w-full max-w-7xl px-gutter py-8">
          {children}
        </main>
        <footer className="mx-auto max-w-7xl px-gutter pb-10 pt-6 text-xs text-ink-500">
          Orbit checks are two-body screening estimates, not a substitute for high-fidelity analysis. Debris and licensing rules are those of the
          operator&apos;s own authority.
        </footer>
      </body>
    </html>
  );
}
