// Pieces the sign-in, sign-up, password and invitation pages share.
import Link from "next/link";
import type { ReactNode } from "react";
import { FormMessage } from "@/components/ui/field";

export function AuthLink({ href, children }: { href: string; children: ReactNode }) {
  return (
    <Link href={href} className="link">
      {children}
    </Link>
  );
}

export function BackToSignIn() {
  return (
    <p className="mt-6 text-sm">
      <AuthLink href="/sign-in">Back to sign in</AuthLink>
    </p>
  );
}

/** A link (reset, invitation) that no longer works: what happened and the one way on. */
export function ClosedLink({ title, message, href, action }: { title: string; message: string; href: string; action: string }) {
  return (
    <>
      <h1 className="text-xl font-semibold">{title}</h1>
      <div className="mt-4">
        <FormMessage tone="error">{message}</FormMessage>
      </div>
      <Link href={href} className="btn-quiet mt-6">
        {action}
      </Link>
    </>
  );
}
