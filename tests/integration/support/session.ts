// The integration tests stand in for next-auth's cookie session: everything after it (user lookup,
// membership, role, validation, the handler, the database) is the real code.
let currentUserId: number | null = null;

export const sessionModule = { getSessionUserId: () => Promise.resolve(currentUserId) };

export function actAs(userId: number | null) {
  currentUserId = userId;
}
