import { describe, expect, it } from "vitest";
import { LOCAL_UPLOADTHING_TOKEN } from "./uploads/token";
import { isProductionRuntime, productionEnvProblems } from "./env";

const good = {
  NODE_ENV: "production",
  APP_URL: "https://portal.example",
  AUTH_SECRET: "q".repeat(43),
  STRIPE_SECRET_KEY: "sk_live_abcdefgh",
  STRIPE_WEBHOOK_SECRET: "whsec_abcdefghijklmnop",
  RESEND_API_KEY: "re_abcdefgh",
  UPLOADTHING_TOKEN: Buffer.from(JSON.stringify({ apiKey: "sk_x", appId: "a", regions: ["r"] })).toString("base64"),
};

describe("production environment", () => {
  it("accepts a complete set of secrets of the deployment's own", () => {
    expect(productionEnvProblems(good)).toEqual([]);
  });

  it.each([
    ["AUTH_SECRET", "layerwright-local-demo-secret-change-me"],
    ["STRIPE_WEBHOOK_SECRET", "whsec_layerwright_local"],
    ["STRIPE_SECRET_KEY", "sk_test_layerwright_local"],
    ["RESEND_API_KEY", "re_layerwright_local"],
    ["UPLOADTHING_TOKEN", LOCAL_UPLOADTHING_TOKEN],
  ])("refuses the published demo %s and names it", (name, value) => {
    const problems = productionEnvProblems({ ...good, [name]: value });
    expect(problems).toEqual([`${name} is the published demo value; set a secret of your own`]);
  });

  it("names every missing variable, never a value", () => {
    const problems = productionEnvProblems({ NODE_ENV: "production" });
    expect(problems.map((p) => p.split(" ")[0])).toEqual(["APP_URL", "AUTH_SECRET", "STRIPE_SECRET_KEY", "STRIPE_WEBHOOK_SECRET", "RESEND_API_KEY", "UPLOADTHING_TOKEN"]);
    expect(productionEnvProblems({ ...good, AUTH_SECRET: "short-secret" })).toEqual(["AUTH_SECRET is too short (at least 32 characters)"]);
    expect(productionEnvProblems({ ...good, APP_URL: "portal.example" })).toEqual(["APP_URL must be an absolute http(s) URL, e.g. https://portal.example"]);
  });

  it("applies to a production server, not to the build or to development", () => {
    expect(isProductionRuntime({ NODE_ENV: "production" })).toBe(true);
    expect(isProductionRuntime({ NODE_ENV: "production", NEXT_PHASE: "phase-production-build" })).toBe(false);
    expect(isProductionRuntime({ NODE_ENV: "development" })).toBe(false);
    expect(isProductionRuntime({ NODE_ENV: "test" })).toBe(false);
  });
});
