import type { User as UserModel } from './db/models/User'

declare global {
  namespace Express {
    // passport puts the loaded model on req.user.
    interface User extends UserModel {}
  }
}
declare module 'express-session' {
  interface SessionData {
    passport?: { user?: string }
  }
}
export {}
