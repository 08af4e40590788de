import type { Metadata, Viewport } from "next";
import { connection } from "next/server";
import { Providers } from "@/components/providers";
import { plexMono, plexSans, sourceSerif } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Undertone", template: "%s · Undertone" },
  description: "A colour-lab notebook for small hand-dye studios.",
};

export const viewport: Viewport = {
  width: "device-width",
  initialScale: 1,
  themeColor: "#f6f2ea",
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page is rendered per request, so Next can put this response's CSP nonce on its
  // scripts (lib/security/csp.ts); a page prerendered at build time would have none.
  await connection();
  return (
    <html lang="en" className={`${plexSans.variable} ${sourceSerif.variable} ${plexMono.variable}`}>
      <body>
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
