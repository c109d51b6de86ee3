import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // The test suite builds into its own folder so it can run while the demo is served.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  serverExternalPackages: ["pg", "@node-rs/argon2", "minio", "nodemailer"],
  poweredByHeader: false,
  // The build type-checks the application only; tests and scripts are checked by `npm test`.
  typescript: { tsconfigPath: "tsconfig.build.json" },
  reactStrictMode: true,
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "same-origin" },
          { key: "X-Frame-Options", value: "DENY" },
        ],
      },
    ];
  },
};

export default nextConfig;
