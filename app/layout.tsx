import type { Metadata } from "next";
import type { ReactNode } from "react";
import { inter } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Emfolio", template: "%s · Emfolio" },
  description: "Waveform analysis and test records for alternator and permanent-magnet machine benches.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={inter.variable}>
      <body className="min-h-screen font-sans">{children}</body>
    </html>
  );
}
