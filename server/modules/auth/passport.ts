/**
 * Passport with the local (e-mail + password) strategy. Its own Passport instance, so nothing
 * depends on the module-global singleton. The session holds only the person's id; every
 * request reloads the person, so a disabled account or a changed role takes effect at once.
 */
import { Passport } from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import type { Caller } from "../../lib/caller";
import { sessionCaller, verifyCredentials } from "./auth.service";

export const passport = new Passport();

passport.use(
  "local",
  new LocalStrategy(
    { usernameField: "email", passwordField: "password", passReqToCallback: true, session: false },
    (req, email, password, done) => {
      verifyCredentials(email.trim(), password, { requestId: String(req.id ?? ""), ip: req.ip ?? "" }).then(
        (caller) => done(null, caller ?? false),
        (err: unknown) => done(err),
      );
    },
  ),
);

passport.serializeUser((user, done) => {
  done(null, (user as Caller).id);
});

passport.deserializeUser((id: unknown, done) => {
  if (typeof id !== "number" || !Number.isInteger(id)) return done(null, false);
  sessionCaller(id).then(
    (caller) => done(null, caller ?? false),
    (err: unknown) => done(err),
  );
});
