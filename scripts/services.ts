/** `npm run services`: only the local services (PostgreSQL, S3, mail inbox), for `next dev` or tools. */
import { startServices } from "./lib/services";
import { databaseUrl, demoSettings } from "./lib/settings";

const settings = demoSettings();
const services = await startServices(settings);
console.log(
  [
    "Local services are up (Ctrl-C stops them):",
    `  PostgreSQL  ${databaseUrl(settings)}`,
    `  S3          http://127.0.0.1:${settings.s3.port}  bucket ${settings.s3.bucket}`,
    `  SMTP inbox  127.0.0.1:${settings.smtp.port}  → ${settings.smtp.inboxDir}`,
  ].join("\n"),
);
const stop = async () => {
  await services.stop();
  process.exit(0);
};
process.on("SIGINT", () => void stop());
process.on("SIGTERM", () => void stop());
