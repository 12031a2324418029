/** The name to greet someone by in tight places (the header): the first word of their display name. */
export function firstName(displayName: string) {
  return displayName.trim().split(/\s+/)[0] || displayName;
}
