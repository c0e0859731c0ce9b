/**
 * Escapes text for the HTML part of a mail (names, titles and labels people typed).
 *
 * @example escapeHtml('<b>') // '&#60;b&#62;'
 */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}
