import type { RequestHandler } from "express";
import { AppError } from "../lib/app-error";

export const unauthenticated = () =>
  new AppError(401, "unauthenticated", "Please sign in to continue. Your session may have ended.");

/** Lets signed-in people through; everyone else gets 401. */
export const requireAuth: RequestHandler = (req, _res, next) => {
  next(req.user ? undefined : unauthenticated());
};
