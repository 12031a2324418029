/** Motors and their checks are private: only their owner may see or change them; everyone else is told they do not exist. */
export function canSeeMotor(user: { id: string } | null, row: { ownerId: string }): boolean {
  return !!user && user.id === row.ownerId;
}
