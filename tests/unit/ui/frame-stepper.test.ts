// The stepper the Clip and Digitise pages share: every step lands, synchronously, inside the clip.
import { describe, expect, it } from "vitest";
import { frameCommandFor, runFrameCommand } from "@/components/shot/stepping/frame-keys";
import { FrameStepper } from "@/components/shot/stepping/frame-stepper";

describe("frame stepper", () => {
  it("thirty steps in a row with nothing in between move thirty frames", () => {
    const s = new FrameStepper(1, 480);
    let told = 0;
    s.subscribe(() => told++);
    for (let i = 0; i < 30; i++) runFrameCommand(frameCommandFor({ key: "ArrowRight" })!, s, s.getState());
    expect(s.getState().frame).toBe(31);
    expect(told).toBe(30);
  });

  it("keys: Shift steps ten, Home and End go to the ends, modified keys are left to the browser", () => {
    const s = new FrameStepper(1, 100, 50);
    runFrameCommand(frameCommandFor({ key: "ArrowLeft", shiftKey: true })!, s, s.getState());
    expect(s.getState().frame).toBe(40);
    runFrameCommand(frameCommandFor({ key: "End" })!, s, s.getState());
    expect(s.getState().frame).toBe(100);
    runFrameCommand(frameCommandFor({ key: "Home" })!, s, s.getState());
    expect(s.getState().frame).toBe(1);
    expect(frameCommandFor({ key: "ArrowRight", ctrlKey: true })).toBeNull();
    expect(frameCommandFor({ key: "a" })).toBeNull();
  });

  it("stays inside the frames that exist, and follows a clip that gains frames while extracting", () => {
    const s = new FrameStepper(1, 20, 500);
    expect(s.getState().frame).toBe(20);
    s.stepBy(-100);
    expect(s.getState().frame).toBe(1);
    s.goto(Number.NaN);
    expect(s.getState().frame).toBe(1);
    s.setRange(1, 60);
    s.goto(55.4);
    expect(s.getState().frame).toBe(55);
    s.setRange(1, 30);
    expect(s.getState().frame).toBe(30);
  });
});
