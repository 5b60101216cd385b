/** What every page carries: the running header, the footer with the caution and page x of y, and the draft watermark. */
import { Path, Svg, Text, View } from "@react-pdf/renderer";
import { WATERMARK_SHAPE } from "./draft-watermark-shape";
import { colours, PAGE_MARGIN_X, s } from "./styles";
import type { WorkpaperData } from "./workpaper-data";
import { formatDate } from "@/lib/format/date";

export const CAUTION =
  "These results support, and do not replace, the auditor's professional judgement, the applicable standards (AU-C 530, ISA 530, AS 2315) and the firm's methodology.";

/** A4 is 841.89 pt tall: the footer sits 20 pt above the bottom edge. */
const FOOTER_TOP = 841.89 - 20 - 30;

export const DRAFT_MARK = "DRAFT — NOT SIGNED OFF";

/** What the frame prints: any workpaper (the sample's, the summary of misstatements) can supply it. */
export type PageFrameData = Pick<
  WorkpaperData,
  "firmName" | "clientName" | "engagementName" | "periodEnd" | "workpaperReference" | "draft"
> & { caution?: string };

export function RunningHeader({ data }: { data: PageFrameData }) {
  return (
    <View fixed style={{ position: "absolute", top: 24, left: PAGE_MARGIN_X, right: PAGE_MARGIN_X }}>
      <View style={{ flexDirection: "row", alignItems: "flex-end" }}>
        <View style={{ flex: 1 }}>
          <Text style={[s.bold, { fontSize: 9 }]}>{data.firmName}</Text>
          <Text style={[s.soft, s.small]}>
            {data.clientName} · {data.engagementName} · period ended {formatDate(data.periodEnd)}
          </Text>
        </View>
        <View style={{ alignItems: "flex-end" }}>
          <Text style={[s.faint, { fontSize: 6.5, letterSpacing: 0.6 }]}>WORKPAPER</Text>
          <Text style={[s.bold, { fontSize: 10, color: colours.ledger }]}>{data.workpaperReference}</Text>
        </View>
      </View>
      <View style={{ height: 1.6, backgroundColor: colours.ledger, marginTop: 5 }} />
      {data.draft && (
        <View
          style={{
            flexDirection: "row",
            backgroundColor: colours.draftTint,
            paddingVertical: 2,
            paddingHorizontal: 6,
            marginTop: 2,
          }}
        >
          <Text style={{ fontSize: 7, fontWeight: "bold", color: colours.draft, letterSpacing: 0.8 }}>
            {DRAFT_MARK}
          </Text>
          <Text style={{ fontSize: 7, color: colours.draft, marginLeft: 8 }}>
            Preview before lock — not for reliance
          </Text>
        </View>
      )}
    </View>
  );
}

export function Footer({ data }: { data: PageFrameData }) {
  return (
    // Positioned from the top with a fixed height: an auto-height bottom-anchored fixed view drifts on long documents (react-pdf #3416).
    <View
      fixed
      style={{ position: "absolute", top: FOOTER_TOP, height: 30, left: PAGE_MARGIN_X, right: PAGE_MARGIN_X }}
    >
      <View style={{ height: 0.5, backgroundColor: colours.hairline, marginBottom: 4 }} />
      <View style={{ flexDirection: "row" }}>
        <Text style={[s.faint, { flex: 1, fontSize: 6.5, paddingRight: 16 }]}>{data.caution ?? CAUTION}</Text>
        <View style={{ alignItems: "flex-end", width: 120 }}>
          <Text
            style={{ fontSize: 7.5 }}
            render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`}
          />
          <Text
            style={[s.faint, { fontSize: 6.5 }]}
          >{`Workpaper ${data.workpaperReference}${data.draft ? " · draft" : ""}`}</Text>
        </View>
      </View>
    </View>
  );
}

/** The diagonal draft mark, drawn as a vector shape (see generate-watermark-shape.mjs) at low opacity. */
export function DraftWatermark() {
  const width = 600;
  const height = (width * WATERMARK_SHAPE.height) / WATERMARK_SHAPE.width;
  return (
    <View fixed style={{ position: "absolute", top: 400, left: 0, right: 0, height, alignItems: "center" }}>
      <View style={{ width, height, transform: "rotate(-36deg)" }}>
        <Svg width={width} height={height} viewBox={`0 0 ${WATERMARK_SHAPE.width} ${WATERMARK_SHAPE.height}`}>
          <Path d={WATERMARK_SHAPE.d} fill={colours.draft} fillOpacity={0.08} />
        </Svg>
      </View>
    </View>
  );
}
