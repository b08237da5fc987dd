"use client";
// Signing on the customer's phone: confirm the e-mail with a one-time code, read and accept the
// electronic-records disclosure, type the name, draw the signature (signature_pad, pointer
// events), sign. The server checks everything again; this screen only guides.
import { useEffect, useRef, useState, type FormEvent, type RefObject } from "react";
import type SignaturePad from "signature_pad";
import { Field, StatusMessage, type Notice } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { ApiError } from "@/lib/api-client";
import { fieldErrorsToErrors } from "@/lib/form-errors";
import { formatCents } from "@/lib/format";

type Chosen = { position: number; name: string; contractCents: number };
type Props = { token: string; label: string; companyName: string; repName: string; repEmail: string; chosen: Chosen };

type Step = "start" | "code" | "sign";

export function SigningPanel({ token, label, companyName, repName, repEmail, chosen }: Props) {
  const base = `/api/public/proposals/${token}`;
  const { step, setStep, sentTo, code, setCode, codeError, message, setMessage, busy, requestCode, verify } = useCodeStep(base);

  return (
    <section aria-labelledby="sign-heading" className="card p-4" data-testid="signing-panel">
      <h2 id="sign-heading" className="text-lg font-semibold">
        Sign this proposal
      </h2>
      <p className="mt-1 text-sm text-graphite-soft">
        You are signing for <strong className="text-graphite">&ldquo;{chosen.name}&rdquo;</strong> at <span className="figure font-semibold text-graphite">{formatCents(chosen.contractCents)}</span>. To choose
        another option, pick it above.
      </p>

      {step === "start" ? (
        <div className="mt-4">
          <p className="text-sm">First, confirm it is you: we e-mail a one-time code to the address this proposal was sent to.</p>
          <button type="button" className="btn-primary mt-3 w-full" onClick={requestCode} disabled={busy}>
            E-mail me a code
          </button>
        </div>
      ) : null}

      {step === "code" ? (
        <CodeForm code={code} setCode={setCode} codeError={codeError} busy={busy} sentTo={sentTo} onSubmit={verify} onResend={requestCode} />
      ) : null}

      {message ? (
        <div className="mt-3">
          <StatusMessage notice={message} />
        </div>
      ) : null}

      {step === "sign" ? (
        <SignForm
          base={base}
          label={label}
          companyName={companyName}
          repName={repName}
          repEmail={repEmail}
          chosen={chosen}
          onNeedCode={(text) => {
            setStep("start");
            setMessage({ tone: "error", text });
          }}
        />
      ) : null}
    </section>
  );
}

/** Our own wording of the consumer disclosures of the ESIGN Act, 15 U.S.C. 7001(c)(1). */
export function EsignDisclosure({ companyName, repName, repEmail }: { companyName: string; repName: string; repEmail: string }) {
  return (
    <div className="space-y-2 rounded-md border border-paper-line bg-paper-deep p-3 text-sm" data-testid="esign-disclosure">
      <h3 className="font-semibold">Before you sign electronically</h3>
      <p>
        <strong>What you agree to.</strong> This proposal, the agreement you sign, its signed copy and the notices about it are given to you electronically: on this page and
        by e-mail to the address the proposal was sent to. Your consent covers this agreement only.
      </p>
      <p>
        <strong>Paper instead.</strong> You do not have to sign electronically. If you would rather sign on paper, do not sign here: ask {repName} for a paper agreement. You can
        also ask {companyName} for a paper copy of any record at any time, free of charge.
      </p>
      <p>
        <strong>Withdrawing your consent.</strong> You may withdraw your consent to electronic records at any time, free of charge, by writing to {repEmail}. From then on we send
        records on paper; a signature you already gave stays valid.
      </p>
      <p>
        <strong>Keeping your contact details current.</strong> If your e-mail address changes, tell {repName} at {repEmail} so notices keep reaching you.
      </p>
      <p>
        <strong>What you need.</strong> A phone or computer with an up-to-date web browser, access to your e-mail, and a program that opens PDF files, plus room on your device
        or a printer to keep a copy. Reading this page and opening the PDF shows you can open the records in the form we use.
      </p>
    </div>
  );
}

function SignForm({
  base,
  label,
  companyName,
  repName,
  repEmail,
  chosen,
  onNeedCode,
}: {
  base: string;
  label: string;
  companyName: string;
  repName: string;
  repEmail: string;
  chosen: Chosen;
  onNeedCode: (message: string) => void;
}) {
  const { canvasRef, padRef, empty, clear } = useSignaturePad();
  const [consent, setConsent] = useState(false);
  const [name, setName] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const signing = useSave<{ position: number; signerName: string; consent: true; signaturePng: string }>({
    request: (json) => ({ url: `${base}/sign`, method: "POST", json }),
    onFieldErrors: (fields) => setErrors(fieldErrorsToErrors(fields)),
    onError: (err) => {
      if (err instanceof ApiError && err.code === "code_required") onNeedCode(err.message);
    },
  });

  function sign(e: FormEvent) {
    e.preventDefault();
    const found: Record<string, string> = {};
    if (!consent) found.consent = "Agree to sign electronically to continue";
    if (name.trim().length < 2) found.signerName = "Type your full name";
    const pad = padRef.current;
    if (!pad || pad.isEmpty()) found.signaturePng = "Draw your signature in the box";
    setErrors(found);
    if (Object.keys(found).length > 0 || !pad) return;
    signing.save({ position: chosen.position, signerName: name.trim(), consent: true, signaturePng: pad.toDataURL("image/png") });
  }

  return (
    <form className="mt-4 space-y-4" onSubmit={sign} noValidate>
      <EsignDisclosure companyName={companyName} repName={repName} repEmail={repEmail} />
      <ConsentField consent={consent} setConsent={setConsent} error={errors.consent} />
      <Field id="signer-name" label="Your full name" autoComplete="name" value={name} error={errors.signerName} onChange={(e) => setName(e.target.value)} />
      <SignatureField canvasRef={canvasRef} empty={empty} onClear={clear} error={errors.signaturePng} />
      <p className="text-sm">
        By pressing <strong>Sign</strong> you sign proposal {label} for &ldquo;{chosen.name}&rdquo; at <span className="figure">{formatCents(chosen.contractCents)}</span>, and you
        intend your typed name and drawn signature to be your signature.
      </p>
      <StatusMessage notice={signing.notice} />
      <button type="submit" className="btn-primary w-full" disabled={signing.pending}>
        {signing.pending ? "Signing…" : "Sign"}
      </button>
    </form>
  );
}

/** The one-time code from the e-mail, with a button for a new one. */
function CodeForm({ code, setCode, codeError, busy, sentTo, onSubmit: verify, onResend: requestCode }: { code: string; setCode: (code: string) => void; codeError: string | null; busy: boolean; sentTo: string | null; onSubmit: (e: FormEvent) => void; onResend: () => void }) {
  return (
    <form className="mt-4 space-y-3" onSubmit={verify} noValidate>
      <Field
        id="signing-code"
        label="6-digit code"
        inputClassName="figure tracking-[0.3em]"
        inputMode="numeric"
        autoComplete="one-time-code"
        maxLength={6}
        value={code}
        error={codeError ?? undefined}
        onChange={(e) => setCode(e.target.value.replace(/\D/g, "").slice(0, 6))}
      />
      <div className="flex flex-col gap-2 sm:flex-row">
        <button type="submit" className="btn-primary flex-1" disabled={busy}>
          Confirm code
        </button>
        <button type="button" className="btn-quiet flex-1" onClick={requestCode} disabled={busy}>
          Send a new code
        </button>
      </div>
      {sentTo ? <p className="text-xs text-graphite-soft">Sent to {sentTo}. Not there? Check the spam folder, or send a new code.</p> : null}
    </form>
  );
}

/** The customer's consent to electronic records and signatures (ESIGN Act, 15 U.S.C. 7001(c)(1)(A)). */
function ConsentField({ consent, setConsent, error }: { consent: boolean; setConsent: (consent: boolean) => void; error: string | undefined }) {
  return (
    <div>
      <label className="flex min-h-touch items-start gap-3 text-sm">
        <input
          type="checkbox"
          className="mt-1 h-5 w-5 accent-copper"
          checked={consent}
          onChange={(e) => setConsent(e.target.checked)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? "consent-error" : undefined}
        />
        <span>I have read the above, I can open and keep these records, and I agree to use electronic records and signatures for this agreement.</span>
      </label>
      {error ? (
        <p id="consent-error" className="field-error" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** The box to draw the signature in, and the button to clear it. */
function SignatureField({ canvasRef, empty, onClear: clear, error }: { canvasRef: RefObject<HTMLCanvasElement | null>; empty: boolean; onClear: () => void; error: string | undefined }) {
  return (
    <div>
      <p id="signature-label" className="field-label">
        Your signature
      </p>
      <canvas
        ref={canvasRef}
        className="block h-40 w-full touch-none rounded-md border border-dashed border-graphite-faint bg-white"
        role="img"
        aria-labelledby="signature-label"
        aria-describedby="signature-hint"
        data-testid="signature-pad"
      />
      <div className="mt-1 flex items-center justify-between gap-2">
        <p id="signature-hint" className="text-xs text-graphite-soft">
          {empty ? "Draw with your finger, a stylus or the mouse." : "Signature drawn."}
        </p>
        <button type="button" className="btn-quiet" onClick={clear}>
          Clear
        </button>
      </div>
      {error ? (
        <p className="field-error" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** The steps before signing: e-mail a one-time code, then check it. */
function useCodeStep(base: string) {
  const [step, setStep] = useState<Step>("start");
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [code, setCode] = useState("");
  const [codeError, setCodeError] = useState<string | null>(null);
  const [message, setMessage] = useState<Notice | null>(null);
  // The page is this panel's state until the signature: no refresh between the steps.
  const sendCode = useSave<void, { sentTo: string; expiresAt: string }>({
    request: () => ({ url: `${base}/code`, method: "POST" }),
    refresh: false,
    notify: (n) => {
      setMessage(n);
      if (!n) setCodeError(null);
    },
    success: (r) => `We e-mailed a 6-digit code to ${r.sentTo}. It works for 10 minutes.`,
    onSaved: (r) => {
      setSentTo(r.sentTo);
      setCode("");
      setStep("code");
    },
  });
  // A wrong code belongs to the field; a used-up, expired or missing one to the panel.
  const checkCode = useSave<string>({
    request: (value) => ({ url: `${base}/verify-code`, method: "POST", json: { code: value } }),
    refresh: false,
    notify: (n) => n?.tone !== "error" && setMessage(n),
    success: "E-mail confirmed. You have 30 minutes to sign.",
    onSaved: () => setStep("sign"),
    onError: (err) => {
      if (err instanceof ApiError && ["code_locked", "code_expired", "no_code"].includes(err.code)) setMessage({ tone: "error", text: err.message });
      else setCodeError(err.message);
    },
  });
  const busy = sendCode.pending || checkCode.pending;
  const requestCode = () => sendCode.save();

  function verify(e: FormEvent) {
    e.preventDefault();
    if (!/^\d{6}$/.test(code.trim())) {
      setCodeError("Enter the 6 digits from the e-mail");
      return;
    }
    setCodeError(null);
    checkCode.save(code.trim());
  }
  return { step, setStep, sentTo, code, setCode, codeError, message, setMessage, busy, requestCode, verify };
}

/** The signature pad on the canvas: loaded in the browser only, refitted to the canvas when the window resizes. */
function useSignaturePad() {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const padRef = useRef<SignaturePad | null>(null);
  const [empty, setEmpty] = useState(true);

  useEffect(() => {
    let pad: SignaturePad | null = null;
    let cancelled = false;
    const canvas = canvasRef.current;
    const fit = () => {
      if (!canvas || !pad) return;
      // A sharp drawing on high-density screens, capped so the PNG stays small.
      const ratio = Math.min(2, Math.max(window.devicePixelRatio || 1, 1));
      canvas.width = canvas.offsetWidth * ratio;
      canvas.height = canvas.offsetHeight * ratio;
      canvas.getContext("2d")?.scale(ratio, ratio);
      pad.clear();
      setEmpty(true);
    };
    void import("signature_pad").then(({ default: Pad }) => {
      if (cancelled || !canvas) return;
      pad = new Pad(canvas, { penColor: "#1F2933", minWidth: 0.8, maxWidth: 2.6 });
      pad.addEventListener("endStroke", () => setEmpty(pad?.isEmpty() ?? true));
      padRef.current = pad;
      fit();
    });
    window.addEventListener("resize", fit);
    return () => {
      cancelled = true;
      window.removeEventListener("resize", fit);
      pad?.off();
      padRef.current = null;
    };
  }, []);

  function clear() {
    padRef.current?.clear();
    setEmpty(true);
  }
  return { canvasRef, padRef, empty, clear };
}
