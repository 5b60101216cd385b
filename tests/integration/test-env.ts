import path from "node:path";

/** Where integration tests point the app's services: their own database, storage fake and upload folder. */
export const TEST_ENV = {
  DB_NAME: "sondage_test",
  S3_ENDPOINT: "http://127.0.0.1:4579",
  S3_BUCKET: "sondage-integration",
  S3_ACCESS_KEY_ID: "S3RVER",
  S3_SECRET_ACCESS_KEY: "S3RVER",
  UPLOAD_DIR: path.join(import.meta.dirname, "../../.data/uploads-integration"),
};
