import { Router } from "express";
import { headersOf, requireUser, signedInOf } from "../auth/context";
import { parse } from "../http/validate";
import { ActiveTeamBodySchema, PrefsBodySchema } from "../../shared/schemas/roster";
import { me, setActiveTeam, updatePrefs } from "./service";

export const meRouter = Router();
meRouter.use(requireUser);
meRouter.get("/", async (req, res) => void res.json(await me(signedInOf(req))));
meRouter.put("/active-team", async (req, res) => {
  const { teamId } = parse(ActiveTeamBodySchema, req.body);
  const r = await setActiveTeam(signedInOf(req), headersOf(req), teamId);
  for (const c of r.setCookies) res.append("Set-Cookie", c);
  res.json(r.me);
});
meRouter.patch("/prefs", async (req, res) => void res.json(await updatePrefs(signedInOf(req), parse(PrefsBodySchema, req.body))));
