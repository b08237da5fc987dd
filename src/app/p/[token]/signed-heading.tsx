"use client";
// The signed confirmation's heading. Right after signing (the signing form sets the flag just
// before the page refreshes in place) it takes the focus, so a screen reader and the keyboard
// land on "Signed" instead of the top of the page; a later visit leaves the focus alone.
import { useEffect, useRef } from "react";
import { JUST_SIGNED_KEY } from "./signing-panel";

export function SignedHeading({ token }: { token: string }) {
  const ref = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    if (sessionStorage.getItem(JUST_SIGNED_KEY) !== token) return;
    sessionStorage.removeItem(JUST_SIGNED_KEY);
    ref.current?.focus();
  }, [token]);
  return (
    <h2 id="signed-heading" ref={ref} tabIndex={-1} className="text-xl font-semibold focus:outline-none">
      Signed — here is your copy
    </h2>
  );
}
