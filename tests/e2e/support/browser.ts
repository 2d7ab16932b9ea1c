// Debian's Chromium, headless, with the background services that reach out to the network switched off.
import { chromium, type Browser } from "playwright-core";

export const CHROMIUM = "/usr/bin/chromium";

export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
}
