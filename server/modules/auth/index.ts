/** Sign-in: the module that owns `password_resets` and `rate_limit_hits`. Others call what is exported here. */
export { useResets } from "./auth.repository";
