/**
 * Runs once when the server starts: the mail sender begins its periodic sweep, so mail
 * queued just before a restart (or waiting for a retry) goes out without a new request, and
 * the alert scan begins looking for causes that come with time alone (a limit date coming
 * inside the alert horizon).
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { kickOutbox } = await import("./lib/mail/outbox");
  kickOutbox();
  const { startAlertScan } = await import("./lib/notifications/scan");
  startAlertScan();
}
