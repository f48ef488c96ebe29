import type { Metadata } from "next";
import { sans, mono } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Tautline", template: "%s · Tautline" },
  description: "Chain-lift dynamics for roller-coaster ride engineers, operations staff and trainers.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen font-sans antialiased">{children}</body>
    </html>
  );
}
