import { describe, expect, it } from "vitest";
import { ImportError } from "@/lib/imports/import-error";
import { inspectUpload } from "@/lib/imports/inspect-upload";
import { MAX_DATA_ROWS, MAX_UPLOAD_BYTES } from "@/lib/imports/limits";
import { sniffFile } from "@/lib/imports/sniff-file";
import { fixtureFolder } from "./temp-files";

const write = fixtureFolder();
const limits = { maxBytes: MAX_UPLOAD_BYTES };

async function refusal(promise: Promise<unknown>): Promise<ImportError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(ImportError);
  return error as ImportError;
}

describe("limits", () => {
  it("are the issue's 200 MB and 1,000,000 data rows", () => {
    expect(MAX_UPLOAD_BYTES).toBe(200 * 1024 * 1024);
    expect(MAX_DATA_ROWS).toBe(1_000_000);
  });
});

describe("sniffFile", () => {
  it("detects UTF-8 with and without BOM", async () => {
    expect(await sniffFile(write("plain.csv", "Ref,Amount\nA-1,12.00\n"), limits)).toMatchObject({
      kind: "csv",
      encoding: "utf-8",
    });
    const bom = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from("Réf,Montant\nA,1\n")]);
    expect(await sniffFile(write("bom.csv", bom), limits)).toMatchObject({ kind: "csv", encoding: "utf-8-bom" });
  });

  it("detects Windows-1252 from é (0xE9) and € (0x80)", async () => {
    // Code page 1252: 0x80 = U+20AC EURO SIGN, 0xE9 = U+00E9 (unicode.org MAPPINGS/VENDORS/MICSFT/WINDOWS/CP1252.TXT).
    const bytes = Buffer.from([
      ...Buffer.from("Ref;Libell"),
      0xe9,
      ...Buffer.from(";Montant\nA;Caf"),
      0xe9,
      ...Buffer.from(";12,00 "),
      0x80,
      0x0a,
    ]);
    expect(await sniffFile(write("cp1252.csv", bytes), limits)).toMatchObject({
      kind: "csv",
      encoding: "windows-1252",
    });
  });

  it("refuses UTF-16 with its BOM, naming the encoding", async () => {
    const utf16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from("Ref,Amount\n", "utf16le")]);
    const error = await refusal(sniffFile(write("utf16.csv", utf16), limits));
    expect(error.reason).toBe("unsupported-encoding");
    expect(error.message).toMatch(/UTF-16/);
    expect(error.status).toBe(422);
  });

  it("refuses bytes that are neither UTF-8 nor Windows-1252", async () => {
    const error = await refusal(sniffFile(write("odd.csv", Buffer.from([0x41, 0x2c, 0x81, 0x0a])), limits));
    expect(error.reason).toBe("unsupported-encoding");
    expect(error.message).toMatch(/neither UTF-8 nor Windows-1252.*0x81/);
  });

  it("refuses a binary file renamed .csv", async () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d, 0x49, 0x48, 0x44, 0x52]);
    const error = await refusal(sniffFile(write("picture.csv", png), limits));
    expect(error.reason).toBe("binary-file");
    expect(error.message).toMatch(/NUL byte at position 9/);
  });

  it("refuses a zip that holds no workbook, and the old .xls format", async () => {
    const zipHead = Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 0, 0, 0, 0]);
    expect((await refusal(sniffFile(write("archive.xlsx", zipHead), limits))).reason).toBe("not-a-workbook");
    const ole = Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 1, 2, 3]);
    expect((await refusal(sniffFile(write("old.xls", ole), limits))).reason).toBe("unsupported-format");
  });

  it("refuses an empty file and a file over the size limit, naming the limit", async () => {
    const empty = await refusal(sniffFile(write("empty.csv", ""), limits));
    expect(empty.reason).toBe("empty-file");
    const big = await refusal(sniffFile(write("big.csv", "x".repeat(3 * 1024 * 1024)), { maxBytes: 2 * 1024 * 1024 }));
    expect(big.reason).toBe("file-too-large");
    expect(big.status).toBe(413);
    expect(big.message).toBe("The file is 3.0 MB; the largest upload accepted is 2.0 MB.");
  });

  it("answers with the status, and the reason as its code, through toResponse()", async () => {
    const error = await refusal(inspectUpload(write("blank-lines.csv", "\n,,\n\n")));
    const response = error.toResponse();
    expect(response.status).toBe(422);
    expect(await response.json()).toEqual({
      error: { code: "empty-file", message: "The file has no rows with values." },
    });
  });
});
