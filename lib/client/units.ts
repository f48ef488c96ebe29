/**
 * Display units at the edge, for components: the one table of display quantities lives in
 * lib/units/display.ts (shared with the server's reports and exports).
 */
export * from "@/lib/units/display";
