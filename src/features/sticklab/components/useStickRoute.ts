import { useParams } from "react-router-dom";
import { useActiveTeam } from "@/lib/session";
import { useStick } from "../api/stick";

/** The team and the stick named in the URL, loaded; every stick page starts here. */
export function useStickRoute() {
  const team = useActiveTeam();
  const { stickId = "", testId } = useParams();
  const stick = useStick(team?.id ?? "", stickId);
  return { teamId: team?.id ?? "", teamName: team?.name ?? "", stickId, testId, stick };
}
