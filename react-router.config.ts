import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // A separate folder lets two builds (say, two test runs) live side by side.
  buildDirectory: process.env.FALLWRIGHT_BUILD_DIR ?? "build",
  future: {
    v8_middleware: false,
    v8_splitRouteModules: true,
    v8_viteEnvironmentApi: true,
  },
} satisfies Config;
