import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";

export default defineConfig({
  plugins: [tailwindcss(), reactRouter()],
  resolve: { tsconfigPaths: true },
  server: { watch: { ignored: ["**/.data/**", "**/db/**", "**/tests/**", "**/lessons/**"] } },
  // Module workers (the page starts them with type "module"), so the engine's worker can load its
  // fall unit reader on demand (docs/decisions/0015-lazy-unit-reader.md); an iife worker inlines it.
  worker: { format: "es" },
  optimizeDeps: {
    include: ["three", "@react-three/fiber", "@react-three/drei", "mathjs", "zod", "zustand"],
  },
});
