// Local fakes of hosted services (SMTP, S3), started when the production settings are absent.
// Filled in as the services arrive; returns the environment the web server needs.
export async function startFakes() {
  return { env: {}, stop() {} };
}
