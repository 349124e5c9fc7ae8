import { defineConfig } from "vite";
import react from "@vitejs/plugin-react";
import { fileURLToPath } from "node:url";

const dir = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export const aliases = {
  "@/": dir("./src/"),
  "@server/": dir("./server/"),
  "@shared/": dir("./shared/"),
};

export default defineConfig({
  plugins: [react()],
  resolve: {
    alias: Object.entries(aliases).map(([find, replacement]) => ({ find, replacement })),
  },
  server: {
    port: Number(process.env.VITE_PORT ?? 5173),
    proxy: { "/api": `http://127.0.0.1:${process.env.PORT ?? 3000}` },
  },
  // pdf.js's worker (about 1.2 MB) is the one large file; it loads only when a PDF plan is traced.
  build: { outDir: "dist", sourcemap: false, chunkSizeWarningLimit: 1300 },
});
