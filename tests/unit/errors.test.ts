import { describe, expect, it } from "vitest";
import { AppError, notFound } from "@/lib/errors";

describe("AppError", () => {
  it("maps codes to HTTP statuses", () => {
    expect(new AppError("conflict", "x").status).toBe(409);
    expect(notFound("Lot").status).toBe(404);
    expect(notFound("Lot").message).toBe("Lot was not found.");
  });
});
