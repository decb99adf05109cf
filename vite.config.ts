import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";

export default defineConfig({
  plugins: [tailwindcss(), reactRouter()],
  resolve: { tsconfigPaths: true },
  server: { watch: { ignored: ["**/.data/**", "**/db/**", "**/tests/**", "**/lessons/**"] } },
  optimizeDeps: {
    include: ["three", "@react-three/fiber", "@react-three/drei", "mathjs", "zod", "zustand"],
  },
});
