import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import QRCode from "qrcode";
import { getDb } from "@/db/client";
import { getTwoFactor, recoveryCodesLeft, startEnrolment } from "@/db/queries/two-factor";
import { getSignedInUser } from "@/lib/auth/guard";
import { homePathFor } from "@/lib/auth/policy";
import { newTotpSecret, requiresTwoFactor, totpUri } from "@/lib/auth/two-factor";
import { safeCallbackPath } from "@/lib/validation/auth";
import { EnrolForm } from "./_components/enrol-form";
import { ManageTwoFactor } from "./_components/manage-two-factor";

export const metadata: Metadata = { title: "Two-factor sign-in" };
export const dynamic = "force-dynamic";

/** Set up, or look after, the authenticator app that gives the sign-in code. */
export default async function TwoFactorPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string }> }) {
  const user = await getSignedInUser();
  if (!user) redirect("/sign-in?callbackUrl=/two-factor");
  const next = safeCallbackPath((await searchParams).callbackUrl) ?? homePathFor(user.role);
  const db = getDb();
  const required = requiresTwoFactor(user.role);

  if (user.hasTwoFactor) {
    return (
      <>
        <h1 className="text-2xl font-semibold text-ink-900">Two-factor sign-in is on</h1>
        <p className="mt-2 text-sm text-ink-600">Each sign-in asks for the code your authenticator app shows after your password.</p>
        <ManageTwoFactor codesLeft={await recoveryCodesLeft(db, user.id)} canTurnOff={!required} />
        <p className="mt-6 text-sm">
          <Link href={next} className="font-medium text-kiln-700 underline">
            Back to {required ? "the back office" : "the portal"}
          </Link>
        </p>
      </>
    );
  }

  // Keep the secret of an enrolment already begun, so a reload shows the same QR code.
  let factor = await getTwoFactor(db, user.id);
  if (!factor) {
    await startEnrolment(db, user.id, newTotpSecret());
    factor = await getTwoFactor(db, user.id);
  }
  const uri = totpUri(user.email, factor!.secret);
  const qr = await QRCode.toDataURL(uri, { margin: 1, width: 220, errorCorrectionLevel: "M" });
  return (
    <>
      <h1 className="text-2xl font-semibold text-ink-900">Set up two-factor sign-in</h1>
      <p className="mt-2 text-sm text-ink-600">
        {required
          ? "Staff accounts sign in with a password and a code from an authenticator app on your phone. Set it up now to continue."
          : "Add a code from an authenticator app to your password, so a stolen password alone cannot open your firm's files."}
      </p>
      <EnrolForm qrDataUrl={qr} secret={factor!.secret} next={next} />
      {!required ? (
        <p className="mt-6 text-sm">
          <Link href={next} className="font-medium text-kiln-700 underline">
            Not now
          </Link>
        </p>
      ) : null}
    </>
  );
}
