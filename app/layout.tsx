import type { Metadata } from "next";
import type { ReactNode } from "react";
import "./globals.css";
import { jetbrainsMono, plexSans } from "./fonts";
import { Caution } from "@/components/shell/caution";
import { Providers } from "@/components/shell/providers";

export const metadata: Metadata = {
  title: { default: "Tidewright", template: "%s · Tidewright" },
  description: "Draft, simulate, review and export breath-cycle sequences for low-cost ventilators.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${plexSans.variable} ${jetbrainsMono.variable}`}>
      <body className="min-h-screen">
        <Caution />
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
