// Joins class names, skipping empty values, so components can merge caller classes.
export function cn(...parts: Array<string | false | null | undefined>): string {
  return parts.filter(Boolean).join(' ');
}
