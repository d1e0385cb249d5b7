import { describe, expect, it } from "vitest";
import { checkUpload, detectType, sanitizeFileName } from "@/lib/evidence/files";

const PDF = new TextEncoder().encode("%PDF-1.7\n1 0 obj <<>> endobj\n%%EOF\n");
const PNG = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);
const JPEG = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46]);
const CSV = new TextEncoder().encode("sample,E\nVB-1,14\n");
const MB = 1024 * 1024;

describe("file type from the bytes", () => {
  it("recognises PDF, PNG, JPEG and CSV by their contents", () => {
    expect(detectType(PDF)).toBe("pdf");
    expect(detectType(PNG)).toBe("png");
    expect(detectType(JPEG)).toBe("jpeg");
    expect(detectType(CSV)).toBe("csv");
    expect(detectType(new Uint8Array([0x4d, 0x5a, 0x90, 0]))).toBeNull(); // an executable header with NULs
  });
});

describe("upload checks", () => {
  it("accepts a file whose bytes match its extension", () => {
    expect(checkUpload({ name: "Lab report 12.pdf", bytes: PDF, maxBytes: 25 * MB })).toEqual({
      type: "pdf",
      mime: "application/pdf",
      name: "Lab report 12.pdf",
    });
    expect(checkUpload({ name: "membrane.JPG", bytes: JPEG, maxBytes: 25 * MB }).type).toBe("jpeg");
  });
  it("refuses bytes that do not match the extension", () => {
    expect(() => checkUpload({ name: "report.pdf", bytes: PNG, maxBytes: 25 * MB })).toThrow(
      /named as a PDF, but its contents are a PNG image/,
    );
    expect(() =>
      checkUpload({
        name: "photo.png",
        bytes: new Uint8Array([0x4d, 0x5a, 0, 0]),
        maxBytes: 25 * MB,
      }),
    ).toThrow(/not a PDF, PNG, JPEG or CSV/);
  });
  it("refuses a file over the limit", () => {
    expect(() =>
      checkUpload({ name: "big.pdf", bytes: new Uint8Array(2 * MB + 1), maxBytes: 2 * MB }),
    ).toThrow(/the limit is 2\.0 MB/);
  });
  it("refuses a name that leaves the folder", () => {
    expect(() => checkUpload({ name: "../../etc/passwd", bytes: CSV, maxBytes: 25 * MB })).toThrow(
      /folder path/,
    );
    expect(() => sanitizeFileName("..\\..\\boot.ini")).toThrow(/folder path/);
    expect(() => sanitizeFileName(".htaccess")).toThrow(/starts with a dot/);
  });
  it("keeps a readable name, replacing risky characters", () => {
    expect(sanitizeFileName("  Messbericht <Größe> µm.pdf ")).toBe("Messbericht _Größe_ µm.pdf");
    expect(sanitizeFileName(`${"a".repeat(300)}.pdf`)).toHaveLength(120);
  });
  it("refuses a CSV whose cells start with = + - @", () => {
    const bytes = new TextEncoder().encode(
      'sample,E\n=cmd|" /C calc"!A0,1\nVB-2,+5\nVB-3,-2\n@SUM(1),3\n',
    );
    expect(() => checkUpload({ name: "counts.csv", bytes, maxBytes: 25 * MB })).toThrow(
      /row 2, column 1 starts with "="; row 3, column 2 starts with "\+"; row 4, column 2 starts with "-"; row 5, column 1 starts with "@"/,
    );
  });
});
