import { Body, Button, Container, Head, Heading, Hr, Html, Preview, Section, Text } from "@react-email/components";
import { render } from "@react-email/render";

export interface MailContent {
  subject: string;
  /** One line shown by mail clients beside the subject. */
  preview: string;
  heading: string;
  paragraphs: string[];
  /**
   * Pre-rendered, already escaped HTML placed after the paragraphs (a decision letter body),
   * with its plain-text twin. Only ever built by our own renderers, never from raw input.
   */
  body?: { html: string; text: string };
  action?: { label: string; url: string };
  /** Small print under the body (why the person received this). */
  footnote?: string;
}

const colours = { ink: "#121a30", muted: "#45537a", brand: "#4b52d1", paper: "#fdfcf8", rule: "#d9deeb" };

/** VisViva's e-mail look: one column, the mark's blue for the action, plain-text twin. */
export function MailLayout({ content }: { content: MailContent }) {
  return (
    <Html lang="en">
      <Head />
      <Preview>{content.preview}</Preview>
      <Body style={{ backgroundColor: colours.paper, color: colours.ink, fontFamily: "'Source Sans 3', Helvetica, Arial, sans-serif" }}>
        <Container style={{ maxWidth: "560px", padding: "24px" }}>
          <Text style={{ color: colours.brand, fontWeight: 700, letterSpacing: "0.08em", fontSize: "12px", textTransform: "uppercase" }}>VisViva</Text>
          <Heading as="h1" style={{ fontSize: "22px", margin: "8px 0 16px" }}>
            {content.heading}
          </Heading>
          {content.paragraphs.map((p, i) => (
            <Text key={i} style={{ fontSize: "16px", lineHeight: "24px" }}>
              {p}
            </Text>
          ))}
          {content.body ? (
            <Section style={{ fontSize: "16px", lineHeight: "24px", borderLeft: `3px solid ${colours.brand}`, paddingLeft: "16px", margin: "16px 0" }}>
              <div dangerouslySetInnerHTML={{ __html: content.body.html }} />
            </Section>
          ) : null}
          {content.action ? (
            <Section style={{ margin: "24px 0" }}>
              <Button
                href={content.action.url}
                style={{ backgroundColor: colours.brand, color: "#ffffff", padding: "12px 20px", borderRadius: "6px", fontWeight: 600 }}
              >
                {content.action.label}
              </Button>
            </Section>
          ) : null}
          <Hr style={{ borderColor: colours.rule }} />
          <Text style={{ color: colours.muted, fontSize: "12px" }}>
            {content.footnote ?? "You receive this because you take part in a review board on VisViva."}
          </Text>
        </Container>
      </Body>
    </Html>
  );
}

/** HTML and plain-text versions of one message. */
export async function renderMail(content: MailContent): Promise<{ subject: string; html: string; text: string }> {
  const html = await render(<MailLayout content={content} />);
  const text = [
    content.heading,
    "",
    ...content.paragraphs.flatMap((p) => [p, ""]),
    ...(content.body ? [content.body.text, ""] : []),
    ...(content.action ? [`${content.action.label}: ${content.action.url}`, ""] : []),
    "--",
    content.footnote ?? "You receive this because you take part in a review board on VisViva.",
  ].join("\n");
  return { subject: content.subject, html, text };
}
