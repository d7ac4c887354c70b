import type { Metadata } from "next";
import Link from "next/link";
import type { ReactNode } from "react";
import { buttonClass } from "@/components/ui/button-class";
import { PageHeading, Panel, PanelHeader } from "@/components/ui/panel";
import { env } from "@/lib/env";
import { requireUser } from "@/lib/session";

export const metadata: Metadata = { title: "API and command line" };

function Code({ label, children }: { label: string; children: string }) {
  return (
    <figure className="space-y-1.5">
      <figcaption className="text-ink-700 text-sm">{label}</figcaption>
      <pre className="border-paper-200 bg-paper-50 rounded-panel overflow-x-auto border p-3 font-mono text-[13px] leading-relaxed">
        <code>{children}</code>
      </pre>
    </figure>
  );
}

function Section({
  id,
  title,
  description,
  children,
}: {
  id: string;
  title: string;
  description: ReactNode;
  children: ReactNode;
}) {
  return (
    <Panel aria-labelledby={id}>
      <PanelHeader id={id} title={title} description={description} />
      <div className="space-y-5 p-5">{children}</div>
    </Panel>
  );
}

/** Examples of the JSON API (curl) and of the `phasewright` command, with this server's address. */
export default async function ApiDocsPage() {
  await requireUser();
  const base = env.NEXTAUTH_URL.replace(/\/+$/, "");
  return (
    <div className="mx-auto max-w-3xl space-y-8 px-4 py-10 sm:px-6">
      <PageHeading
        title="API and command line"
        lead="Everything the web app does with runs is open to scripts: the JSON API with an API token, and the phasewright command for a repository's designs in CI."
        action={
          <Link href="/settings" className={buttonClass({ variant: "secondary", size: "sm" })}>
            Back to settings
          </Link>
        }
      />
      <Section
        id="describe-heading"
        title="The API description"
        description="OpenAPI 3.1, generated from the same schemas the server checks requests with."
      >
        <p className="text-ink-700 text-sm">
          Load{" "}
          <a className="text-board-700 font-medium underline" href="/api/openapi.json">
            /api/openapi.json
          </a>{" "}
          into any OpenAPI tool to see every route, its fields and limits, and the error shape{" "}
          <code className="font-mono">{"{error: {code, message, details}}"}</code>. Create a token under{" "}
          <Link className="text-board-700 font-medium underline" href="/settings#tokens-heading">
            API tokens
          </Link>{" "}
          and send it as <code className="font-mono">Authorization: Bearer pw_…</code>. A run of a team you
          are not in answers 404.
        </p>
      </Section>
      <Section
        id="curl-heading"
        title="With curl"
        description="Keep the token in the environment, not in the script."
      >
        <Code label="Solve a netlist without saving it">{`export PHASEWRIGHT_TOKEN=pw_…
curl -s ${base}/api/solve \\
  -H "Authorization: Bearer $PHASEWRIGHT_TOKEN" \\
  -H "Content-Type: application/json" \\
  --data "$(jq -Rs '{netlist: .}' designs/filter.pwn)"`}</Code>
        <Code label="Save it as a run of a project (the project's id is in its address)">{`curl -s ${base}/api/projects/PROJECT_ID/runs \\
  -H "Authorization: Bearer $PHASEWRIGHT_TOKEN" \\
  -H "Content-Type: application/json" \\
  --data "$(jq -Rs '{title: "rev C", netlist: .}' designs/filter.pwn)"`}</Code>
        <Code label="Read a run, or compare two">{`curl -s -H "Authorization: Bearer $PHASEWRIGHT_TOKEN" \\
  ${base}/api/runs/RUN_ID
curl -s -H "Authorization: Bearer $PHASEWRIGHT_TOKEN" \\
  "${base}/api/compare?a=OLD_RUN_ID&b=NEW_RUN_ID"`}</Code>
      </Section>
      <Section
        id="command-heading"
        title="The phasewright command"
        description="Built by npm ci in a checkout of this project; run it with npx from there."
      >
        <Code label="Solve one netlist: summary, --json or --csv">
          {"npx phasewright solve designs/filter.pwn"}
        </Code>
        <Code label="Check every design: exit 0 all checks pass, 1 a check fails, 2 netlist errors">
          {"npx phasewright check 'designs/**/*.pwn' --report junit phasewright.xml"}
        </Code>
        <Code label="Hold a design to a signed-off run: fail when a measure moves past its limit">{`export PHASEWRIGHT_URL=${base}
export PHASEWRIGHT_TOKEN=pw_…
npx phasewright check designs/filter.pwn --against RUN_ID \\
  --tolerance f0=0.5% --tolerance pm=2deg`}</Code>
        <p className="text-ink-600 text-sm">
          <code className="font-mono">npx phasewright help</code> lists every option.
        </p>
      </Section>
    </div>
  );
}
