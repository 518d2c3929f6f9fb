"use client";

// The last resort when even the root layout fails: plain markup, no app styles assumed.
export default function GlobalError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <html lang="en-GB">
      <body style={{ fontFamily: "system-ui, sans-serif", background: "#f6f5f1", color: "#111720", padding: "3rem 1rem", textAlign: "center" }}>
        <h1 style={{ fontSize: "1.5rem", fontWeight: 600 }}>Kalibore could not load</h1>
        <p style={{ marginTop: "0.75rem" }}>The server could not answer just now. Anything already saved is safe.</p>
        {error.digest ? <p style={{ fontFamily: "monospace", marginTop: "0.75rem" }}>reference {error.digest}</p> : null}
        <button type="button" onClick={() => reset()} style={{ marginTop: "1.5rem", padding: "0.75rem 1.25rem", fontSize: "1rem", borderRadius: 6, border: "1px solid #111720", background: "#fff" }}>
          Try again
        </button>
      </body>
    </html>
  );
}
