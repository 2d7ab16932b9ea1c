import { defineConfig } from "vite";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";

// The browser client. `vite build` writes dist/client, which the Express server serves; in development
// the Vite server forwards /api to the Express server so cookies stay same-origin (QUARTERBEAT_API points it
// at a server on another address).
export default defineConfig({
  plugins: [react(), tailwindcss()],
  publicDir: "src/public",
  build: {
    outDir: "dist/client",
    emptyOutDir: true,
    sourcemap: true,
  },
  server: {
    proxy: {
      "/api": { target: process.env.QUARTERBEAT_API ?? "http://localhost:3000", changeOrigin: false },
    },
  },
});
