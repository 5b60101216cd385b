/** Section 1: what the test is for. */
import { Text } from "@react-pdf/renderer";
import { Facts, Paragraph, Section } from "./primitives";
import type { WorkpaperData } from "./workpaper-data";
import { DIRECTION_LABELS } from "@/lib/validation/sample";

export function ObjectiveSection({ data }: { data: WorkpaperData }) {
  const o = data.objective;
  return (
    <Section number="1" title="Objective and assertion">
      <Paragraph>{o.objective}</Paragraph>
      <Facts
        facts={[
          { label: "Assertion", value: o.assertion },
          { label: "Direction tested", value: DIRECTION_LABELS[o.direction] },
          ...(o.misstatementDefinition
            ? [
                {
                  label: data.plan.method === "attribute" ? "Deviation is" : "Misstatement is",
                  value: o.misstatementDefinition,
                },
              ]
            : []),
        ]}
      />
      <Text> </Text>
    </Section>
  );
}
