/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native and Node-only packages stay outside the server bundle.
  serverExternalPackages: ["@node-rs/argon2", "@libsql/client", "libsql", "nodemailer", "smtp-server", "mailparser", "@react-pdf/renderer"],
  poweredByHeader: false,
  experimental: {
    serverActions: { bodySizeLimit: "4mb" },
    // forbidden() answers 403 from a page whose role check fails.
    authInterrupts: true,
  },
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "same-origin" },
          { key: "X-Frame-Options", value: "DENY" },
          { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=()" },
        ],
      },
    ];
  },
};

export default nextConfig;
