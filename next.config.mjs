// The proxy buffers request bodies up to this size and silently truncates larger ones, so an
// evidence file under UPLOAD_MAX_MB arrived cut short and failed as "not a multipart form".
// Allow the upload limit plus room for the form's other fields; the route refuses a larger file itself.
const uploadMaxMb = Number(process.env.UPLOAD_MAX_MB) > 0 ? Number(process.env.UPLOAD_MAX_MB) : 25;

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native and Node-only packages stay outside the server bundle.
  serverExternalPackages: [
    "@node-rs/argon2",
    "@libsql/client",
    "libsql",
    "nodemailer",
    "smtp-server",
    "mailparser",
    "@react-pdf/renderer",
  ],
  poweredByHeader: false,
  experimental: {
    serverActions: { bodySizeLimit: "4mb" },
    proxyClientMaxBodySize: (uploadMaxMb + 1) * 1024 * 1024,
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
