/**
 * The Permissions-Policy header (W3C Permissions Policy): browser features Hearthloop never
 * uses are denied to its pages and to anything they might embed, so an injected script or a
 * framed page cannot turn on a camera, ask for a payment or reach a USB device. The client
 * places homes by a map click, the street list or typed coordinates and never reads the
 * device's position, so geolocation is denied too; a client that starts using
 * `navigator.geolocation` must allow it here as `(self)` (a test checks the two agree).
 */
import type { RequestHandler } from "express";

/**
 * Denied features. A browser that does not know a name only warns in its console: Chromium 156
 * on Linux knows all but `bluetooth` and `web-share`, which phones' browsers do know.
 */
export const DENIED_FEATURES = [
  "accelerometer",
  "autoplay",
  "bluetooth",
  "browsing-topics",
  "camera",
  "clipboard-read",
  "clipboard-write",
  "display-capture",
  "encrypted-media",
  "fullscreen",
  "gamepad",
  "geolocation",
  "gyroscope",
  "hid",
  "identity-credentials-get",
  "idle-detection",
  "local-fonts",
  "magnetometer",
  "microphone",
  "midi",
  "otp-credentials",
  "payment",
  "picture-in-picture",
  "publickey-credentials-create",
  "publickey-credentials-get",
  "screen-wake-lock",
  "serial",
  "storage-access",
  "usb",
  "web-share",
  "window-management",
  "xr-spatial-tracking",
] as const;

export const PERMISSIONS_POLICY = DENIED_FEATURES.map((feature) => `${feature}=()`).join(", ");

/** Sets the policy on every response, API answers, errors and the client's files alike. */
export const permissionsPolicy: RequestHandler = (_req, res, next) => {
  res.setHeader("Permissions-Policy", PERMISSIONS_POLICY);
  next();
};
