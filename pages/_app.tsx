import type { AppProps } from "next/app";
import localFont from "next/font/local";
import "../app/globals.css";

/** The pages router's shell (only the landing page, pages/index.tsx): the app's stylesheet and font. */
const inter = localFont({
  src: "../app/fonts/inter-latin-wght.woff2",
  variable: "--font-inter",
  display: "swap",
  weight: "100 900",
});

export default function App({ Component, pageProps }: AppProps) {
  return (
    <div className={`${inter.variable} min-h-screen font-sans`}>
      <Component {...pageProps} />
    </div>
  );
}
