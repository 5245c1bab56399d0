// The signed-in person, and people as the administrator lists them (/api/auth, /api/users).
import { z } from 'zod';
import { id } from './common';

/** A person as the API shows them: never a password or hash. */
export const user = z.strictObject({
  id,
  email: z.string(),
  name: z.string(),
  isAdmin: z.boolean(),
  licenceNumber: z.string().nullable(),
  jurisdiction: z.string().nullable(),
});
export type User = z.infer<typeof user>;

/** A person as the admin screen lists them: with whether (and since when) they are deactivated. */
export const managedUser = user.extend({ deactivatedAt: z.string().nullable() });
export type ManagedUser = z.infer<typeof managedUser>;

/** GET /api/auth/me. */
export const meResponse = z.strictObject({ user });
export type MeResponse = z.infer<typeof meResponse>;

/** POST /api/auth/sign-in: the person and the session's CSRF token. */
export const signInResponse = z.strictObject({ user, csrfToken: z.string().min(1) });
export type SignInResponse = z.infer<typeof signInResponse>;

/** GET /api/users (administrator). */
export const usersResponse = z.strictObject({ users: z.array(managedUser) });
export type UsersResponse = z.infer<typeof usersResponse>;

/** POST and PATCH /api/users…: the person as listed. */
export const managedUserResponse = z.strictObject({ user: managedUser });
export type ManagedUserResponse = z.infer<typeof managedUserResponse>;
