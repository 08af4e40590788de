import { describe, expect, it } from "vitest";
import { env } from "@/lib/env";

describe("env", () => {
  it("falls back to the loopback services", () => {
    expect(env.S3_ENDPOINT).toMatch(/^http:\/\/127\.0\.0\.1/);
  });
});
