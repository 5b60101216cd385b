// E2E_SLOT lets several e2e runs share the machine; CI and `npm test` use slot 0. The one place the slot's
// database, server port and fake services are worked out (playwright.config.ts, the global set-up, page objects).
export const E2E_SLOT = Number(process.env.E2E_SLOT ?? 0);
export const E2E_PORT = 3100 + E2E_SLOT;
export const E2E_DB_NAME = E2E_SLOT === 0 ? "sondage_e2e" : `sondage_e2e${E2E_SLOT}`;

// The e2e server's own fakes of hosted services, on ports apart from `npm start`'s and from the integration
// runs' (tests/integration/test-env.ts takes offsets 5, 6 and 9 of each slot's block of ten; e2e takes 7, 8 and 4).
export const E2E_SERVICES = {
  S3_ENDPOINT: `http://127.0.0.1:${4584 + E2E_SLOT * 10}`,
  S3_BUCKET: "sondage-e2e",
  SMTP_HOST: "127.0.0.1",
  SMTP_PORT: String(2537 + E2E_SLOT * 10),
  MAIL_INBOX_PORT: String(2538 + E2E_SLOT * 10),
  UPLOAD_DIR: `.data/uploads-${E2E_DB_NAME}`,
};

/** The fake SMTP server's inbox (GET lists the caught messages, DELETE empties it). */
export const E2E_INBOX_URL = `http://127.0.0.1:${E2E_SERVICES.MAIL_INBOX_PORT}/messages`;
