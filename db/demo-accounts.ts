// The invented demo team and household. Nobody here is real.
export const DEMO_PASSWORD = "walk-the-house";

export const demoTeam = { id: "team_lanternfield", name: "Lanternfield Low Voltage" } as const;

export const demoAccounts = [
  { id: "user_imke", name: "Imke Varga", email: "imke@lanternfield.test", role: "admin" },
  { id: "user_tomas", name: "Tomas Ferreira-Lund", email: "tomas@lanternfield.test", role: "designer" },
  { id: "user_priya", name: "Priya Halloway", email: "priya@lanternfield.test", role: "surveyor" },
  { id: "user_june", name: "June Okonkwo-Lindqvist", email: "june@okonkwo-lindqvist.test", role: "client" },
] as const;
