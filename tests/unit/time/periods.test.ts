/**
 * Calendar periods in the workspace's time zone.
 * INTL  the runtime's own Intl.DateTimeFormat, called for every instant (lib/time/format.ts's
 *       formatDate): the fast path's per-day offset cache must give the same local date (a
 *       general-purpose reference implementation of the IANA zone data).
 * EU    EU summer time (Directive 2000/84/EC): starts and ends at 01:00 UTC on the last Sunday of
 *       March and of October (a) — 2026-03-29 and 2026-10-25.
 * ISO   ISO 8601 weeks start on Monday (a); PostgreSQL's date_trunc('week', …) gives that Monday
 *       (a, PostgreSQL manual, date_trunc).
 */
import { describe, expect, it } from "vitest";
import { formatDate } from "@/lib/time/format";
import { localDate, monthLabel, nextPeriod, parseDateKey, periodOf, periodOfDate, periodsBetween } from "@/lib/time/periods";
import { mulberry32 } from "@/support/prng";

describe("localDate", () => {
  it("gives the local calendar date on both sides of midnight (INTL)", () => {
    // 2026-06-14 22:30 UTC is 00:30 on the 15th in Berlin (UTC+2 in summer) and 10:30 on the 15th in Auckland.
    expect(localDate("2026-06-14T22:30:00Z", "UTC")).toBe("2026-06-14");
    expect(localDate("2026-06-14T22:30:00Z", "Europe/Berlin")).toBe("2026-06-15");
    expect(localDate("2026-06-14T22:30:00Z", "America/New_York")).toBe("2026-06-14");
    expect(localDate(new Date("2026-06-14T22:30:00Z"), "Pacific/Auckland")).toBe("2026-06-15");
  });

  it("switches offset at the EU summer-time change, at 01:00 UTC (EU a)", () => {
    // 2026-03-29: before 01:00 UTC Berlin is UTC+1, after it UTC+2. 22:59:59 UTC the day before is 23:59:59 local.
    expect(localDate("2026-03-28T22:59:59Z", "Europe/Berlin")).toBe("2026-03-28");
    expect(localDate("2026-03-28T23:00:00Z", "Europe/Berlin")).toBe("2026-03-29");
    // 2026-10-25 at 22:00 UTC: UTC+1 again, so 23:00 local, still the 25th; at 23:00 UTC it is the 26th.
    expect(localDate("2026-10-25T22:00:00Z", "Europe/Berlin")).toBe("2026-10-25");
    expect(localDate("2026-10-25T23:00:00Z", "Europe/Berlin")).toBe("2026-10-26");
    // A zone that changes offset at a half hour and on a day when UTC midnight and local midnight differ.
    expect(localDate("2026-04-04T13:29:59Z", "Australia/Lord_Howe")).toBe(formatDate("2026-04-04T13:29:59Z", "Australia/Lord_Howe"));
  });

  it("agrees with Intl for random instants over 2025–2027 in six zones (INTL)", () => {
    const random = mulberry32(20261205);
    const start = Date.parse("2025-01-01T00:00:00Z");
    const span = 3 * 365 * 86_400_000;
    for (const zone of ["UTC", "Europe/Berlin", "America/New_York", "Australia/Lord_Howe", "Asia/Kathmandu", "America/St_Johns"]) {
      for (let i = 0; i < 300; i++) {
        const at = start + Math.floor(random() * span);
        expect(localDate(at, zone), `${new Date(at).toISOString()} in ${zone}`).toBe(formatDate(at, zone));
      }
    }
  });

  it("agrees with Intl every 20 minutes across the 2026 daylight-saving changes (INTL; EU a)", () => {
    const changes: [string, string][] = [
      ["Europe/Berlin", "2026-03-29"],
      ["Europe/Berlin", "2026-10-25"],
      ["America/New_York", "2026-03-08"],
      ["America/St_Johns", "2026-11-01"],
      ["Australia/Lord_Howe", "2026-04-05"],
      ["Australia/Lord_Howe", "2026-10-04"],
    ];
    for (const [zone, day] of changes) {
      const middle = Date.parse(`${day}T00:00:00Z`);
      for (let at = middle - 86_400_000; at <= middle + 2 * 86_400_000; at += 20 * 60_000) {
        expect(localDate(at, zone), `${new Date(at).toISOString()} in ${zone}`).toBe(formatDate(at, zone));
      }
    }
  });

  it("refuses an unknown zone and an invalid instant", () => {
    expect(() => localDate("2026-01-01T00:00:00Z", "Mars/Olympus")).toThrow(RangeError);
    expect(() => localDate("yesterday", "UTC")).toThrow(RangeError);
  });
});

describe("periods", () => {
  it("weeks start on Monday (ISO a): 2026-12-06 is a Sunday, its week is Monday 2026-11-30", () => {
    expect(periodOfDate("2026-12-06", "week")).toBe("2026-11-30");
    expect(periodOfDate("2026-11-30", "week")).toBe("2026-11-30");
    expect(periodOfDate("2026-12-07", "week")).toBe("2026-12-07");
    // Across a year end: 2027-01-01 is a Friday; its week began on Monday 2026-12-28.
    expect(periodOfDate("2027-01-01", "week")).toBe("2026-12-28");
  });

  it("gives a Monday at most six days back for every day of 1965–2035, before 1970 too (ISO a; the runtime's getUTCDay)", () => {
    const DAY_MS = 86_400_000;
    for (let ms = Date.UTC(1965, 0, 1); ms <= Date.UTC(2035, 11, 31); ms += DAY_MS) {
      const date = new Date(ms).toISOString().slice(0, 10);
      const monday = periodOfDate(date, "week");
      const mondayMs = Date.parse(`${monday}T00:00:00Z`);
      if (new Date(mondayMs).getUTCDay() !== 1 || ms - mondayMs < 0 || ms - mondayMs > 6 * DAY_MS) expect.fail(`${date} → ${monday}`);
    }
    // The same key twice (the second from the memo) and a bad key after a good one.
    expect(periodOfDate("1969-12-31", "week")).toBe("1969-12-29");
    expect(periodOfDate("1969-12-31", "week")).toBe("1969-12-29");
    expect(() => parseDateKey("1969-02-29")).toThrow(RangeError);
  });

  it("months start on the 1st; days are themselves", () => {
    expect(periodOfDate("2026-02-28", "month")).toBe("2026-02-01");
    expect(periodOfDate("2026-02-28", "day")).toBe("2026-02-28");
    expect(nextPeriod("2026-12-01", "month")).toBe("2027-01-01");
    expect(nextPeriod("2026-02-28", "day")).toBe("2026-03-01");
  });

  it("an instant's period follows the zone: Monday 00:30 in Berlin is Sunday 22:30 UTC", () => {
    expect(periodOf("2026-11-29T23:30:00Z", "week", "Europe/Berlin")).toBe("2026-11-30");
    expect(periodOf("2026-11-29T23:30:00Z", "week", "UTC")).toBe("2026-11-23");
  });

  it("lists every period between two dates, both ends included", () => {
    expect(periodsBetween("2026-11-04", "2026-12-02", "week")).toEqual(["2026-11-02", "2026-11-09", "2026-11-16", "2026-11-23", "2026-11-30"]);
    expect(periodsBetween("2026-11-15", "2027-02-01", "month")).toEqual(["2026-11-01", "2026-12-01", "2027-01-01", "2027-02-01"]);
    expect(periodsBetween("2026-11-15", "2026-11-15", "day")).toEqual(["2026-11-15"]);
    expect(() => periodsBetween("2026-12-02", "2026-11-04", "week")).toThrow(/starts .* after it ends/);
  });

  it("refuses dates that are not calendar dates", () => {
    for (const bad of ["2026-02-30", "2026-13-01", "26-01-01", "2026-1-1", ""]) expect(() => parseDateKey(bad), bad).toThrow(RangeError);
  });
});

describe("monthLabel", () => {
  it("names a month period by its English abbreviation and year, as Intl's en-GB short month does (INTL)", () => {
    expect(monthLabel("2026-11-01")).toBe("Nov 2026");
    expect(monthLabel("2027-01-01")).toBe("Jan 2027");
    for (let month = 1; month <= 12; month++) {
      const key = `2026-${String(month).padStart(2, "0")}-01`;
      const reference = new Intl.DateTimeFormat("en-GB", { month: "short", year: "numeric", timeZone: "UTC" }).format(new Date(`${key}T00:00:00Z`));
      // en-GB writes September "Sept"; the label keeps three letters for every month.
      expect(monthLabel(key)).toBe(month === 9 ? "Sep 2026" : reference);
    }
  });

  it("refuses what is not a date key", () => {
    expect(() => monthLabel("2026-13-01")).toThrow(RangeError);
    expect(() => monthLabel("Nov 2026")).toThrow(RangeError);
  });
});
