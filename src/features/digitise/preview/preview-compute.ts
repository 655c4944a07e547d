import { storedShotResults } from "@shared/mechanics/compute-shot";

// The preview computes what the server stores for the same document — the same engine, trials
// and seed — so a number and its ± read the same on Digitise as on the readout, in the PDF and the
// CSV. (With fewer trials here, the ± differed in its last digit: ±1.3 km/h beside ±1.2.)
export const previewResults = storedShotResults;
