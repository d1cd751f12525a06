import pino from "pino";
import { env } from "../config/env";

/** Application logger. Redacts anything that could carry a secret. */
export const logger = pino({
  level: env().LOG_LEVEL,
  redact: {
    paths: [
      "req.headers.cookie",
      "req.headers.authorization",
      "req.headers['x-csrf-token']",
      'res.headers["set-cookie"]',
      "*.password",
      "*.token",
    ],
    remove: true,
  },
});
