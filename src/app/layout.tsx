import "./globals.css";
import { ServiceWorkerStart } from "@/components/service-worker-start";
import { atkinson, atkinsonExtended } from "./fonts";
import type { Metadata, Viewport } from "next";

export const metadata: Metadata = {
  title: { default: "Lodebook", template: "%s · Lodebook" },
  description: "Field logbook and production ledger for a gold prospecting club.",
  applicationName: "Lodebook",
  manifest: "/manifest.webmanifest",
  icons: { icon: "/icons/icon-192.png", apple: "/icons/icon-192.png" },
};

export const viewport: Viewport = {
  width: "device-width",
  initialScale: 1,
  // The on-screen keyboard shrinks the layout, so bars stuck to the bottom (a weigh-in's Save)
  // stay above it instead of behind it.
  interactiveWidget: "resizes-content",
  themeColor: [
    { media: "(prefers-color-scheme: light)", color: "#f6f1e4" },
    { media: "(prefers-color-scheme: dark)", color: "#121416" },
  ],
};

// Applies a chosen theme before the first paint, so the page never flashes the other one.
const themeScript = `try{var t=localStorage.getItem("lodebook-theme");if(t==="light"||t==="dark")document.documentElement.dataset.theme=t}catch(e){}`;

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${atkinson.variable} ${atkinsonExtended.variable}`} suppressHydrationWarning>
      <head>
        <script dangerouslySetInnerHTML={{ __html: themeScript }} />
      </head>
      <body className="bg-paper text-ink antialiased">
        {children}
        <ServiceWorkerStart />
      </body>
    </html>
  );
}
