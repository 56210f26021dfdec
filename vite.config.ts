import tailwindcss from "@tailwindcss/vite";
import react from "@vitejs/plugin-react";
import { defineConfig } from "vite";

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    host: "127.0.0.1",
    port: 5173,
    // npm run dev: the API runs on PORT (default 3000) from scripts/dev.sh.
    proxy: { "/api": "http://127.0.0.1:3000", "/auth": "http://127.0.0.1:3000" },
  },
  build: { outDir: "dist", emptyOutDir: true, chunkSizeWarningLimit: 700 },
});
