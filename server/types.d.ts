/// <reference types="passport" />
import type { CurrentUser } from './accounts/current-user';

declare global {
  namespace Express {
    // passport types request.user as Express.User; ours is always a CurrentUser.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends CurrentUser {}
  }
}
