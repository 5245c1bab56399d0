import { useOutletContext } from 'react-router-dom';
import type { User } from '../../../../core/contract/people';

/** The signed-in person, inside a page under ProtectedLayout. */
export function useSignedInUser(): User {
  return useOutletContext<User>();
}
