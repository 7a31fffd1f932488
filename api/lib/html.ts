const entities: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/** For the few HTML strings the server writes itself (e-mails). */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (char) => entities[char]!);
}
