import { describe, expect, it } from "vitest";
import { parseTrendQuery, trendQueryString } from "@/lib/trends/query";
import { renderTrendCsv } from "@/lib/trends/csv";

describe("parseTrendQuery", () => {
  it("parseTrendQuery: blanks take the defaults and the first of repeated values counts", () => {
    const { query } = parseTrendQuery({ figure: "", order: "", from: "", x: ["date", "serial"] });
    expect(query).toMatchObject({ figure: "voltage", order: 5, x: "date", from: undefined });
  });

  it("parseTrendQuery: each bad parameter is named", () => {
    const { query, errors } = parseTrendQuery(new URLSearchParams("figure=volts&order=1e309&from=2026-02-30&rating=x&kind=spin&to=9999-12-31"));
    expect(query).toBeNull();
    expect(errors.map((e) => e.split(":")[0]).sort()).toEqual(["figure", "from", "kind", "order", "rating", "to"]);
  });

  it("parseTrendQuery: To before From is refused on To", () => {
    expect(parseTrendQuery({ from: "2026-03-01", to: "2026-02-01" }).errors).toEqual(["to: To must not be before From"]);
  });

  it("trendQueryString: the parsed query back as parameters, blanks left out", () => {
    const { query } = parseTrendQuery({ figure: "harmonic", order: "7" });
    expect(trendQueryString({ ...query!, rating: undefined })).toBe("figure=harmonic&order=7&x=serial");
  });
});

describe("renderTrendCsv", () => {
  it("renderTrendCsv: one row per point, text a spreadsheet would run quoted, numbers as written", () => {
    const csv = renderTrendCsv({
      band: { lower: 380, upper: 420, nominal: 400, unit: "V", marginal: [] },
      points: [
        { unitId: "u1", serial: "=SUM(A1)", captureId: "c1", measuredAt: "2026-02-01T00:00:00.000Z", value: -0.5, status: "pass", flagged: false, testKind: "no-load", bench: "Bay 1, north", rules: [1, 4], expandedUncertainty: null },
        { unitId: "u2", serial: "KG-2", captureId: "c2", measuredAt: "2026-02-02T00:00:00.000Z", value: 401.25, status: "inconclusive", flagged: true, testKind: "no-load", bench: null, rules: [], expandedUncertainty: null },
      ],
    }).split("\r\n");
    expect(csv).toHaveLength(4);
    expect(csv[1]).toBe('"=SUM(A1)",2026-02-01T00:00:00.000Z,-0.5,V,yes,pass,1 4,no-load,"Bay 1, north",,c1');
    expect(csv[2]).toBe("KG-2,2026-02-02T00:00:00.000Z,401.25,V,no,inconclusive,,no-load,,,c2");
    expect(csv[3]).toBe("");
  });
});
