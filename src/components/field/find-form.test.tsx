// @vitest-environment jsdom
import { act, cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import type { LocalFind } from "@/client/device-db";
import { DEFAULT_SETTINGS } from "@/client/settings";
import { toLocalInput } from "@/lib/format";
import { FindForm } from "./find-form";

afterEach(cleanup);

const DAY = 24 * 60 * 60 * 1000;
const find: LocalFind = {
  id: "0190a1b2-0000-7000-8000-000000000001",
  outingId: null,
  claimId: null,
  kind: "nugget",
  weightGrams: 1.25,
  purity: null,
  depthCm: null,
  method: "detecting",
  notes: "",
  lat: null,
  lon: null,
  accuracyM: null,
  locationSource: null,
  foundAt: Date.now() - DAY,
  updatedAt: Date.now() - DAY,
};

async function setFound(ms: number) {
  await act(async () => {
    fireEvent.input(screen.getByLabelText(/^Found/), { target: { value: toLocalInput(ms) } });
  });
}
async function save() {
  await act(async () => {
    fireEvent.click(screen.getByRole("button", { name: "Save changes" }));
  });
}

describe("the find form's date", () => {
  it("asks before saving a date more than a day ahead of the phone's clock, and saves once confirmed", async () => {
    const onSave = vi.fn(async () => {});
    render(<FindForm find={find} claims={[]} settings={DEFAULT_SETTINGS} onSave={onSave} />);
    const ahead = Date.now() + 3 * DAY;
    await setFound(ahead);
    await save();
    expect(onSave).not.toHaveBeenCalled();
    expect(await screen.findByText(/more than a day after this phone's clock/)).toBeTruthy();

    await act(async () => {
      fireEvent.click(screen.getByRole("checkbox", { name: /The date is right/ }));
    });
    await save();
    expect(onSave).toHaveBeenCalledTimes(1);
    const saved = (onSave.mock.calls[0] as unknown as [{ foundAt: number }])[0];
    expect(Math.abs(saved.foundAt - ahead)).toBeLessThan(60_000); // the field holds minutes
  });

  it("saves a date within the day's slack without asking", async () => {
    const onSave = vi.fn(async () => {});
    render(<FindForm find={find} claims={[]} settings={DEFAULT_SETTINGS} onSave={onSave} />);
    await setFound(Date.now() + 2 * 60 * 60 * 1000);
    await save();
    expect(onSave).toHaveBeenCalledTimes(1);
    expect(screen.queryByTestId("confirm-ahead")).toBeNull();
  });

  it("asks again when the date changes after a confirmation", async () => {
    const onSave = vi.fn(async () => {});
    render(<FindForm find={find} claims={[]} settings={DEFAULT_SETTINGS} onSave={onSave} />);
    await setFound(Date.now() + 3 * DAY);
    await save();
    await act(async () => {
      fireEvent.click(screen.getByRole("checkbox", { name: /The date is right/ }));
    });
    await setFound(Date.now() + 30 * DAY);
    await save();
    expect(onSave).not.toHaveBeenCalled();
  });
});
