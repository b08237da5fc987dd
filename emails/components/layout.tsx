// The frame every Kilowright e-mail shares: wordmark as text (no remote images), paper
// background, one copper button, a plain footer. Fonts fall back to system faces: e-mail
// never loads a web font.
import { Body, Button, Container, Head, Heading, Hr, Html, Link, Preview, Section, Text } from "@react-email/components";
import type { CSSProperties, ReactNode } from "react";
import { DEFAULT_LOCALE, type Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";

export const colors = {
  paper: "#FAF7F2",
  card: "#FFFFFF",
  graphite: "#1F2933",
  graphiteSoft: "#52606D",
  line: "#E6DFD3",
  copper: "#B5542D",
} as const;

const fontFamily = "'IBM Plex Sans', 'Helvetica Neue', Helvetica, Arial, sans-serif";

const styles = {
  body: { backgroundColor: colors.paper, color: colors.graphite, fontFamily, margin: 0, padding: "24px 0" },
  container: { maxWidth: "560px", margin: "0 auto", padding: "0 16px" },
  wordmark: { fontSize: "20px", fontWeight: 600, letterSpacing: "0.02em", color: colors.copper, margin: "0 0 16px" },
  card: { backgroundColor: colors.card, border: `1px solid ${colors.line}`, borderRadius: "8px", padding: "24px" },
  heading: { fontSize: "22px", lineHeight: "28px", fontWeight: 600, margin: "0 0 16px", color: colors.graphite },
  button: {
    backgroundColor: colors.copper,
    color: "#FFFFFF",
    borderRadius: "6px",
    fontSize: "16px",
    fontWeight: 600,
    padding: "12px 20px",
    textDecoration: "none",
    display: "inline-block",
  },
  fallback: { fontSize: "13px", lineHeight: "20px", color: colors.graphiteSoft, margin: "16px 0 0", wordBreak: "break-all" },
  fallbackLink: { color: colors.copper },
  footer: { fontSize: "12px", lineHeight: "18px", color: colors.graphiteSoft, margin: "0" },
} satisfies Record<string, CSSProperties>;

/** Body copy in the house style; use for every paragraph so templates stay consistent. */
export function Paragraph({ children }: { children: ReactNode }) {
  return <Text style={{ fontSize: "16px", lineHeight: "24px", margin: "0 0 16px", color: colors.graphite }}>{children}</Text>;
}

export interface EmailLayoutProps {
  /** The line mail apps show next to the subject. */
  preview: string;
  heading: string;
  action: { label: string; href: string };
  children: ReactNode;
  /** A short note under the button: expiry, what to do if unexpected. */
  note?: ReactNode;
  /** The reader's language: a homeowner's e-mail passes theirs; staff mail stays English. */
  locale?: Locale;
}

export function EmailLayout({ preview, heading, action, children, note, locale = DEFAULT_LOCALE }: EmailLayoutProps) {
  const t = translator(locale, "email.layout");
  return (
    <Html lang={locale}>
      <Head />
      <Preview>{preview}</Preview>
      <Body style={styles.body}>
        <Container style={styles.container}>
          <Text style={styles.wordmark}>Kilowright</Text>
          <Section style={styles.card}>
            <Heading as="h1" style={styles.heading}>
              {heading}
            </Heading>
            {children}
            <Section style={{ margin: "8px 0 0" }}>
              <Button href={action.href} style={styles.button}>
                {action.label}
              </Button>
            </Section>
            <Text style={styles.fallback}>
              {t("fallback")}{" "}
              <Link href={action.href} style={styles.fallbackLink}>
                {action.href}
              </Link>
            </Text>
            {note ? <Text style={styles.fallback}>{note}</Text> : null}
          </Section>
          <Hr style={{ borderColor: colors.line, margin: "24px 0 12px" }} />
          <Text style={styles.footer}>{t("footer")}</Text>
        </Container>
      </Body>
    </Html>
  );
}
