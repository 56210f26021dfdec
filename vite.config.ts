import tailwindcss from "@tailwindcss/vite";
import react from "@vitejs/plugin-react";
import { defineConfig } from "vite";
import { precompressAssets } from "./scripts/precompress.ts";

export default defineConfig({
  // precompressAssets: .br and .gz beside each hashed asset, served as they are (server/http/precompressed.ts).
  plugins: [react(), tailwindcss(), precompressAssets()],
  server: {
    host: "127.0.0.1",
    port: 5173,
    // npm run dev: the API runs on PORT (default 3000) from scripts/dev.sh.
    proxy: { "/api": "http://127.0.0.1:3000", "/auth": "http://127.0.0.1:3000" },
  },
  build: { outDir: "dist", emptyOutDir: true, chunkSizeWarningLimit: 700 },
});
