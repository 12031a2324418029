export { mayChangeBaseline } from '../revisions/policy';

/** Uploaded setups are private: only their owner may read, download or delete them. */
export function canReadUpload(user: { id: string } | null, row: { ownerId: string }): boolean {
  return !!user && user.id === row.ownerId;
}
