// The local SMTP stand-in on its own, outside the web app: `node --import tsx server/mail/standin-cli.ts`.
// Keeps what it receives in DATABASE_URL's received_mail table (the Sent mail page), on
// 127.0.0.1:LOCAL_SMTP_PORT (0 picks a free port). Prints "SMTP stand-in listening on 127.0.0.1:PORT"
// when ready and stops on SIGTERM. `npm start` runs the same server inside the app instead.
import { loadConfig } from '../config.js';
import { createSequelize } from '../db/sequelize.js';
import { startSmtpStandIn } from './smtp-standin.js';

async function main() {
  const config = loadConfig({ ...process.env, LOCAL_SMTP_PORT: process.env.LOCAL_SMTP_PORT === '0' ? undefined : process.env.LOCAL_SMTP_PORT });
  if (!config.DATABASE_URL) throw new Error('Set DATABASE_URL to the MariaDB that keeps the received mail.');
  const sequelize = createSequelize(config.DATABASE_URL);
  const port = process.env.LOCAL_SMTP_PORT === '0' ? 0 : config.LOCAL_SMTP_PORT;
  const smtp = await startSmtpStandIn({ sequelize, port });
  console.log(`SMTP stand-in listening on 127.0.0.1:${smtp.port}`);
  const stop = async () => {
    await smtp.close();
    await sequelize.close();
    process.exit(0);
  };
  process.on('SIGTERM', () => void stop());
  process.on('SIGINT', () => void stop());
}

main().catch((err) => {
  console.error(`The SMTP stand-in stopped: ${(err as Error).message}`);
  process.exit(1);
});
