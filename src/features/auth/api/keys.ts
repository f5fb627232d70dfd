/** Query keys of the auth feature; invalidate by prefix (`authKeys.all` covers everything here). */
export const authKeys = {
  all: ['auth'] as const,
  session: () => [...authKeys.all, 'session'] as const,
  me: () => [...authKeys.session(), 'me'] as const,
};
