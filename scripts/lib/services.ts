/** Brings up PostgreSQL, the local S3 store and the mail inbox for one settings profile. */
import { runMigrations } from "../../db/migrate";
import { startLocalMail, type LocalMailHandle } from "./local-mail";
import { startLocalS3, type LocalS3Handle } from "./local-s3";
import { enableAppLogin, ensurePostgres, type PostgresHandle } from "./postgres";
import { databaseUrl, type ServiceSettings } from "./settings";

export type Services = { pg: PostgresHandle; s3: LocalS3Handle | null; mail: LocalMailHandle | null; stop: () => Promise<void> };

export async function startServices(s: ServiceSettings, opts: { freshDatabase?: boolean; localS3?: boolean; localMail?: boolean } = {}): Promise<Services> {
  const test = s.name === "test";
  const pg = await ensurePostgres(s, { freshDatabase: opts.freshDatabase });
  let s3: LocalS3Handle | null = null;
  let mail: LocalMailHandle | null = null;
  try {
    await runMigrations(databaseUrl(s));
    await enableAppLogin(s);
    if (opts.localS3 !== false) {
      const origins = [s.app.url, s.app.url.replace("127.0.0.1", "localhost")];
      s3 = await startLocalS3({ port: s.s3.port, dir: s.s3.dir, bucket: s.s3.bucket, allowedOrigins: origins }, test ? "TEST_S3_PORT" : "LOCAL_S3_PORT");
    }
    if (opts.localMail !== false) mail = await startLocalMail({ port: s.smtp.port, inboxDir: s.smtp.inboxDir }, test ? "TEST_SMTP_PORT" : "LOCAL_SMTP_PORT");
  } catch (err) {
    await s3?.close();
    pg.stop();
    throw err;
  }
  return {
    pg,
    s3,
    mail,
    stop: async () => {
      await Promise.allSettled([s3?.close(), mail?.close()]);
      pg.stop();
    },
  };
}
