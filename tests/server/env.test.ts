import { describe, expect, it } from "vitest";
import { parseEnv, EnvError } from "../../server/config/env";

describe("server configuration", () => {
  it("when keys are malformed, then start-up fails naming each bad key", () => {
    expect(() => parseEnv({ PORT: "not-a-port", DATABASE_URL: "mysql://x", SMTP_URL: "http://x" })).toThrow(EnvError);
    try {
      parseEnv({ PORT: "not-a-port", DATABASE_URL: "mysql://x", SMTP_URL: "http://x" });
    } catch (err) {
      const message = (err as Error).message;
      expect(message).toContain("PORT");
      expect(message).toContain("DATABASE_URL");
      expect(message).toContain("SMTP_URL");
    }
  });

  it("when production runs with the development secret, then start-up fails naming SESSION_SECRET", () => {
    expect(() => parseEnv({ NODE_ENV: "production" })).toThrow(/SESSION_SECRET/);
  });

  it("when nothing is set, then the loopback defaults apply", () => {
    const e = parseEnv({});
    expect(e.HOST).toBe("127.0.0.1");
    expect(e.PORT).toBe(3000);
    expect(e.DEMO_MODE).toBe(false);
  });
});
