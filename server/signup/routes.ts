import { Router } from "express";
import { parse } from "../http/validate";
import { SignupCompleteSchema, SignupStartSchema } from "../../shared/schemas/signup";
import * as svc from "./service";

/** Mounted at /api/signup; nobody is signed in yet. */
export const signupRouter = Router();
signupRouter.post("/", async (req, res) => {
  const { email } = parse(SignupStartSchema, req.body);
  await svc.requestSignup(email);
  res.status(202).json({ sent: true, email });
});
signupRouter.get("/:token", async (req, res) => void res.json(await svc.signupLink(req.params.token)));
signupRouter.post("/:token", async (req, res) => {
  const r = await svc.completeSignup(req.params.token, parse(SignupCompleteSchema, req.body));
  for (const c of r.setCookies) res.append("Set-Cookie", c);
  res.status(201).json({ teamId: r.teamId, clubId: r.clubId });
});
