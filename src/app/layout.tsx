import "./fonts.css";
import "./globals.css";
import type { Metadata, Viewport } from "next";
import { connection } from "next/server";
import type { ReactNode } from "react";
import { QueryProvider } from "@/components/ui/query-provider";
import { ZodJitless } from "@/components/zod-jitless";

export const metadata: Metadata = {
  title: { default: "Kilowright", template: "%s · Kilowright" },
  description: "From utility bills to a live solar system: design, price, sign, build.",
  icons: {
    icon: [
      { url: "/favicon.ico", sizes: "16x16 32x32 48x48" },
      { url: "/icon.svg", type: "image/svg+xml" },
    ],
    apple: "/apple-touch-icon.png",
  },
};

export const viewport: Viewport = { width: "device-width", initialScale: 1, themeColor: "#FAF7F2" };

/** Every page renders per request: its scripts carry the nonce of that request's CSP (src/proxy.ts). */
export default async function RootLayout({ children }: { children: ReactNode }) {
  await connection();
  return (
    <html lang="en">
      <body className="min-h-dvh">
        <ZodJitless />
        <QueryProvider>{children}</QueryProvider>
      </body>
    </html>
  );
}
