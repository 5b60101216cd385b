import { describe, expect, it } from "vitest";
import ExcelJS from "exceljs";
import JSZip from "jszip";
import { sniffEvidence, looksLikeEmail } from "@/lib/files/sniff-evidence";
import { cfbEntryNames } from "@/lib/files/cfb-names";

const ascii = (s: string) => new TextEncoder().encode(s);
const bytes = (...parts: (number[] | string)[]) =>
  new Uint8Array(parts.flatMap((p) => (typeof p === "string" ? [...ascii(p)] : p)));
const kindOf = async (b: Uint8Array, name?: string) => {
  const s = await sniffEvidence(b, name);
  return s.ok ? s.kind : `refused: ${s.reason}`;
};

/**
 * A minimal compound file laid out per [MS-CFB] v3: 512-byte header (2.2), sector 0 holding the
 * FAT (2.3), then the directory sectors (2.6), four 128-byte entries each, chained in the FAT.
 */
function compoundFile(names: string[]): Uint8Array {
  const entries = ["Root Entry", ...names];
  const dirSectors = Math.ceil(entries.length / 4);
  const out = new Uint8Array(512 * (2 + dirSectors));
  const v = new DataView(out.buffer);
  out.set([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]); // header signature
  v.setUint16(0x18, 0x003e, true); // minor version
  v.setUint16(0x1a, 3, true); // major version 3
  v.setUint16(0x1c, 0xfffe, true); // byte order
  v.setUint16(0x1e, 9, true); // sector shift: 512-byte sectors
  v.setUint16(0x20, 6, true); // mini sector shift
  v.setUint32(0x2c, 1, true); // one FAT sector
  v.setUint32(0x30, 1, true); // first directory sector
  v.setUint32(0x38, 4096, true); // mini stream cutoff
  v.setUint32(0x3c, 0xfffffffe, true); // no mini FAT
  v.setUint32(0x44, 0xfffffffe, true); // no DIFAT sectors
  for (let i = 0; i < 109; i++) v.setUint32(0x4c + i * 4, i === 0 ? 0 : 0xffffffff, true);
  const fat = 512;
  for (let i = 0; i < 128; i++) v.setUint32(fat + i * 4, 0xffffffff, true);
  v.setUint32(fat, 0xfffffffd, true); // sector 0 is the FAT itself (FATSECT)
  for (let s = 0; s < dirSectors; s++) v.setUint32(fat + (1 + s) * 4, s === dirSectors - 1 ? 0xfffffffe : 2 + s, true);
  entries.forEach((name, i) => {
    const at = 1024 + i * 128;
    for (let c = 0; c < name.length; c++) v.setUint16(at + c * 2, name.charCodeAt(c), true);
    v.setUint16(at + 0x40, (name.length + 1) * 2, true);
    out[at + 0x42] = i === 0 ? 5 : 2; // root storage, then streams
  });
  return out;
}

async function zipOf(files: Record<string, string>) {
  const zip = new JSZip();
  for (const [name, text] of Object.entries(files)) zip.file(name, text);
  return new Uint8Array(await zip.generateAsync({ type: "uint8array", compression: "DEFLATE" }));
}

describe("sniffEvidence: the magic numbers of each accepted format", () => {
  it("PDF: ISO 32000-1:2008 §7.5.2, the file header %PDF-1.n", async () => {
    expect(await kindOf(bytes("%PDF-1.7\n%\u00e2\u00e3\n1 0 obj"))).toBe("pdf");
    expect(await kindOf(bytes("%PDF-2.0\n"))).toBe("pdf");
    expect(await kindOf(bytes("PDF-1.7"))).toBe("text"); // without the leading % it is only text
  });

  it("PNG: signature 89 50 4E 47 0D 0A 1A 0A (PNG, W3C / ISO/IEC 15948, §5.2)", async () => {
    expect(await kindOf(bytes([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13], "IHDR"))).toBe("png");
    expect(await kindOf(bytes([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x0a]))).toMatch(/^refused/);
  });

  it("JPEG: SOI marker FF D8 followed by a marker (ISO/IEC 10918-1 Annex B; JFIF APP0 FF E0 and Exif APP1 FF E1)", async () => {
    expect(await kindOf(bytes([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10], "JFIF", [0]))).toBe("jpeg");
    expect(await kindOf(bytes([0xff, 0xd8, 0xff, 0xe1, 0x00, 0x10], "Exif", [0, 0]))).toBe("jpeg");
  });

  it("GIF: 'GIF87a' or 'GIF89a' (GIF89a specification §17)", async () => {
    expect(await kindOf(bytes("GIF87a", [1, 0, 1, 0]))).toBe("gif");
    expect(await kindOf(bytes("GIF89a", [1, 0, 1, 0]))).toBe("gif");
  });

  it("WebP: a RIFF container of form type WEBP (RFC 9649 §2.5); another RIFF (WAVE) is refused", async () => {
    expect(await kindOf(bytes("RIFF", [0x24, 0, 0, 0], "WEBPVP8 "))).toBe("webp");
    expect(await kindOf(bytes("RIFF", [0x24, 0, 0, 0], "WAVEfmt "))).toMatch(/^refused/);
  });

  it("TIFF: byte order II with 42 little-endian, or MM with 42 big-endian (TIFF 6.0 §2, Image File Header)", async () => {
    expect(await kindOf(bytes([0x49, 0x49, 0x2a, 0x00, 8, 0, 0, 0]))).toBe("tiff");
    expect(await kindOf(bytes([0x4d, 0x4d, 0x00, 0x2a, 0, 0, 0, 8]))).toBe("tiff");
  });
});

describe("sniffEvidence: Office Open XML packages (ECMA-376 Part 2, Open Packaging Conventions)", () => {
  it("an .xlsx written by exceljs (a general-purpose library) is an Excel workbook", async () => {
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet("Sheet1").addRow(["INV001", 1250]);
    expect(await kindOf(new Uint8Array(await wb.xlsx.writeBuffer()), "whatever.dat")).toBe("xlsx");
  });

  it("a package with word/document.xml is a Word document", async () => {
    expect(
      await kindOf(
        await zipOf({
          "[Content_Types].xml": "<Types/>",
          "_rels/.rels": "<Relationships/>",
          "word/document.xml": "<w:document/>",
        }),
      ),
    ).toBe("docx");
  });

  it("refuses a package with macros, a plain zip, and a package of another kind", async () => {
    expect(
      await kindOf(
        await zipOf({ "[Content_Types].xml": "<Types/>", "xl/workbook.xml": "<workbook/>", "xl/vbaProject.bin": "x" }),
      ),
    ).toMatch(/contains macros/);
    expect(await kindOf(await zipOf({ "invoice.pdf": "%PDF-1.7" }))).toMatch(/zip archive, not an Office document/);
    expect(await kindOf(await zipOf({ "[Content_Types].xml": "<Types/>", "ppt/presentation.xml": "<p/>" }))).toMatch(
      /neither an Excel workbook nor a Word document/,
    );
  });

  it("refuses a truncated zip", async () => {
    const zip = await zipOf({ "[Content_Types].xml": "<Types/>", "xl/workbook.xml": "<workbook/>" });
    expect(await kindOf(zip.subarray(0, 40))).toMatch(/cannot be read/);
  });
});

describe("sniffEvidence: compound files (MS-CFB signature D0 CF 11 E0 A1 B1 1A E1)", () => {
  it("reads the directory of a compound file", () => {
    expect(cfbEntryNames(compoundFile(["Workbook", "\u0005SummaryInformation"]))).toEqual([
      "Root Entry",
      "Workbook",
      "\u0005SummaryInformation",
    ]);
  });

  it("follows the directory chain past its first sector", async () => {
    const names = [
      "\u0005SummaryInformation",
      "\u0005DocumentSummaryInformation",
      "1Table",
      "Data",
      "CompObj",
      "WordDocument",
    ];
    expect(cfbEntryNames(compoundFile(names))).toContain("WordDocument");
    expect(await kindOf(compoundFile(names))).toBe("doc");
  });

  it("tells Excel 97-2003 ([MS-XLS] 2.1.2 Workbook stream), Word ([MS-DOC] 2.1 WordDocument) and Outlook ([MS-OXMSG] 2.1) apart", async () => {
    expect(await kindOf(compoundFile(["Workbook"]))).toBe("xls");
    expect(await kindOf(compoundFile(["Book"]))).toBe("xls");
    expect(await kindOf(compoundFile(["WordDocument", "1Table"]))).toBe("doc");
    expect(
      await kindOf(compoundFile(["__properties_version1.0", "__substg1.0_0037001F", "__recip_version1.0_#00000000"])),
    ).toBe("msg");
  });

  it("refuses macros, encrypted packages and other compound files", async () => {
    expect(await kindOf(compoundFile(["Workbook", "_VBA_PROJECT_CUR"]))).toMatch(/contains macros/);
    expect(await kindOf(compoundFile(["EncryptionInfo", "EncryptedPackage"]))).toMatch(/password-protected/);
    expect(await kindOf(compoundFile(["PowerPoint Document"]))).toMatch(
      /neither an Excel workbook, a Word document nor an Outlook message/,
    );
    expect(await kindOf(compoundFile(["Workbook"]).subarray(0, 600))).toMatch(/cannot be read/);
  });
});

// RFC 5322 Appendix A.1.1, "A Message from One Person to Another with Simple Addressing".
const RFC5322_A11 =
  'From: John Doe <jdoe@machine.example>\r\nTo: Mary Smith <mary@example.net>\r\nSubject: Saying Hello\r\nDate: Fri, 21 Nov 1997 09:55:06 -0600\r\nMessage-ID: <1234@local.machine.example>\r\n\r\nThis is a message just to say hello.\r\nSo, "Hello".\r\n';

describe("sniffEvidence: e-mail messages (RFC 5322)", () => {
  it("recognises the RFC's own example message", async () => {
    expect(await kindOf(ascii(RFC5322_A11), "saved.txt")).toBe("eml");
  });

  it("accepts folded header lines (§2.2.3) and an 8-bit body in another charset", async () => {
    const folded =
      "Received: from x.example\r\n\tby y.example; Fri, 21 Nov 1997 09:55:06 -0600\r\nFrom: a@x.example\r\nDate: Fri, 21 Nov 1997 09:55:06 -0600\r\n\r\n";
    expect(await kindOf(new Uint8Array([...ascii(folded), 0x43, 0x61, 0x66, 0xe9, 0x0d, 0x0a]))).toBe("eml"); // "Café" in ISO-8859-1
  });

  it("needs both required fields (§3.6: Date and From) and only header lines before the blank line", async () => {
    expect(looksLikeEmail("From: a@x.example\r\nSubject: hi\r\n\r\nbody")).toBe(false);
    expect(
      looksLikeEmail("From: a@x.example\r\nDate: Fri, 21 Nov 1997 09:55:06 -0600\r\nnot a header line\r\n\r\n"),
    ).toBe(false);
    expect(await kindOf(ascii("Subject: notes\nDate: today\n\ntext"), "notes.txt")).toBe("text");
  });
});

describe("sniffEvidence: text and refusals", () => {
  it("accepts valid UTF-8 as CSV or plain text (the name decides only between the two)", async () => {
    expect(await kindOf(ascii("ref,amount\nINV001,1250.00\n"), "remittance.csv")).toBe("csv");
    expect(await kindOf(ascii("Société Générale — confirmé\n"), "note.txt")).toBe("text");
    expect(await kindOf(ascii("\uFEFFref;montant\n"), "x.CSV")).toBe("csv");
  });

  it("refuses text that is not UTF-8, or holds NUL or many control bytes", async () => {
    expect(await kindOf(new Uint8Array([0x43, 0x61, 0x66, 0xe9, 0x0a]), "latin1.txt")).toMatch(
      /^refused: .*begins with the bytes 43 61 66 E9/,
    );
    expect(await kindOf(bytes("abc", [0], "def"))).toMatch(/NUL byte at position 4/);
    expect(await kindOf(new Uint8Array(200).fill(1))).toMatch(/control characters/);
  });

  it("refuses programs and archives whatever their names, and says what is accepted", async () => {
    const exe = await sniffEvidence(bytes("MZ", [0x90, 0, 3, 0]), "invoice.pdf");
    expect(exe).toEqual({
      ok: false,
      reason: expect.stringMatching(/Windows program, whatever its name\. Accepted evidence: PDF, PNG/),
    });
    expect(await kindOf(bytes([0x7f], "ELF", [2, 1, 1]))).toMatch(/Linux program/);
    expect(await kindOf(bytes([0x1f, 0x8b, 8, 0]))).toMatch(/gzip archive/);
    expect(await kindOf(bytes("Rar!", [0x1a, 7, 0]))).toMatch(/RAR archive/);
    expect(await kindOf(new Uint8Array(0))).toMatch(/empty/);
  });
});
