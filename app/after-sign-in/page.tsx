import { redirect } from "next/navigation";
import { getSignedInUser, mustEnrolTwoFactor } from "@/lib/auth/guard";
import { homePathFor } from "@/lib/auth/policy";

export const dynamic = "force-dynamic";

/** Where a magic link lands: send each role to its own home. */
export default async function AfterSignInPage() {
  const user = await getSignedInUser();
  if (user && mustEnrolTwoFactor(user)) redirect("/two-factor");
  redirect(user ? homePathFor(user.role) : "/sign-in");
}
