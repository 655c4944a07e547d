// Which archive entries are frames, in what order, and the refusals that name the file (decision 134).
import { describe, expect, it } from "vitest";
import { planSequence, splitNumber } from "../../../server/clips/sequence/names";

const refusal = (names: string[]) => {
  try {
    planSequence(names);
  } catch (err) {
    return err as { code: string; message: string };
  }
  throw new Error("not refused");
};

describe("planSequence", () => {
  it("orders by the frame number's value, any padding, any start", () => {
    const plan = planSequence(["shot/f10.png", "shot/f9.png", "shot/f8.png", "shot/f11.png"]);
    expect(plan.frames.map((f) => f.name)).toEqual(["shot/f8.png", "shot/f9.png", "shot/f10.png", "shot/f11.png"]);
    expect(plan.type).toBe("png");
  });

  it("takes the last number in the name (a camera number before it is part of the name)", () => {
    expect(splitNumber("cam2/run12_000042_L.tif")).toEqual({ stem: "cam2/run12_", digits: "000042", tail: "_L" });
    expect(planSequence(["cam2_0001.tif", "cam2_0002.TIFF"]).frames.map((f) => f.number)).toEqual([1, 2]);
  });

  it("skips files that are not frames and leaves out what systems add by themselves", () => {
    const plan = planSequence(["a_1.jpg", "a_2.jpeg", "settings.cih", "__MACOSX/._a_1.jpg", ".DS_Store", "x/Thumbs.db"]);
    expect(plan.frames).toHaveLength(2);
    expect(plan.skipped).toEqual(["settings.cih"]);
  });

  it("refuses, naming the file: gaps, mixed types, two runs, no number, one number twice, one frame, no image", () => {
    expect(refusal(["r_1.png", "r_2.png", "r_5.png"])).toMatchObject({ code: "sequence_gap", message: expect.stringContaining("r_2.png is followed by r_5.png, so frames 3–4 are missing") });
    expect(refusal(["r_1.png", "r_3.png"]).message).toContain("frame 2 is missing");
    expect(refusal(["r_1.png", "r_2.tif"])).toMatchObject({ code: "sequence_mixed", message: expect.stringContaining("r_2.tif") });
    expect(refusal(["a/r_1.png", "b/r_2.png"])).toMatchObject({ code: "sequence_mixed", message: expect.stringContaining("b/r_2.png") });
    expect(refusal(["left_1.png", "right_2.png"]).code).toBe("sequence_mixed");
    expect(refusal(["r_1.png", "cover.png"])).toMatchObject({ code: "sequence_unnumbered", message: expect.stringContaining("cover.png") });
    expect(refusal(["r_01.png", "r_1.png"])).toMatchObject({ code: "sequence_mixed", message: expect.stringContaining("same frame number (1)") });
    expect(refusal(["r_1.png"]).code).toBe("sequence_too_short");
    expect(refusal(["notes.txt", "clip.mp4"])).toMatchObject({ code: "sequence_not_images", message: expect.stringContaining("notes.txt, clip.mp4") });
  });
});
