import { describe, expect, it } from "vitest";
import { catalogueVersionText, readCatalogueVersion } from "../../common/catalogue-version.ts";
import { formatDate, formatDateTime } from "../../common/dates.ts";
import { thresholdText } from "../../client/components/ui/text-format.ts";

describe("words and numbers shown to people", () => {
  it("when a threshold is a simple fraction, then it reads as one; otherwise three figures", () => {
    // Common practice: the EdGB small-coupling condition is quoted as 16 pi alpha^2 / m^4 < 1/6.
    expect(thresholdText(1 / 6)).toBe("1/6");
    expect(thresholdText(2 / 3)).toBe("2/3");
    expect(thresholdText(0.5)).toBe("0.5");
    expect(thresholdText(1)).toBe("1");
    expect(thresholdText(0.123456)).toBe("0.123");
    expect(thresholdText(1.23456e-7)).toBe("1.23 × 10⁻⁷");
  });

  it("when dates are shown, then they use one format, in UTC", () => {
    expect(formatDate("2026-12-02T23:59:00Z")).toBe("2 Dec 2026");
    expect(formatDateTime("2026-01-05T04:07:00Z")).toBe("5 Jan 2026, 04:07 UTC");
  });

  it("when a catalogue version token is shown, then it reads as entries and a date, and the token is kept", () => {
    const at = Date.UTC(2026, 11, 2, 6, 30);
    const token = `15.21.${at.toString(36)}`;
    expect(readCatalogueVersion(token)).toEqual({ token, entries: 15, changed_at: new Date(at) });
    expect(catalogueVersionText(token)).toBe("15 entries, as of 2 Dec 2026, 06:30 UTC");
    expect(catalogueVersionText("odd")).toBe("version odd");
  });
});
