/**
 * Runs once when the server starts: the mail sender begins its periodic sweep, so mail
 * queued just before a restart (or waiting for a retry) goes out without a new request.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { kickOutbox } = await import("./lib/mail/outbox");
  kickOutbox();
}
