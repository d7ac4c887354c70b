import type { Metadata } from "next";
import { ResetRequestForm } from "@/components/auth/reset-forms";

export const metadata: Metadata = { title: "Reset your password" };

export default function ForgotPage() {
  return (
    <>
      <h1 className="text-ink-950 text-title font-semibold">Reset your password</h1>
      <p className="text-ink-600 mt-1 mb-6 text-sm">
        Give the address you sign in with. We send it a link to choose a new password.
      </p>
      <ResetRequestForm />
    </>
  );
}
