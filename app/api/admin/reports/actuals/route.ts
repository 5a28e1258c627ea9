import { actualVsEstimate } from "@/lib/quoting/actuals";
import { actualsAnswer } from "@/lib/contracts/production";
import { defineRoute } from "@/lib/server/define-route";

export const dynamic = "force-dynamic";

/** Each finished order's recorded actuals against its estimate. */
export const GET = defineRoute({ access: "production:board", response: actualsAnswer }, async ({ db }) => actualVsEstimate(db));
