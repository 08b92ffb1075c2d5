/** An error as one readable line for a command's stderr: its message, never a stack trace. */
export function oneLine(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  return message.split("\n")[0].trim() || "unknown error";
}
