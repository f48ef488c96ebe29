import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  { ignores: [".next/**", ".data/**", "node_modules/**", "test-results/**", "playwright-report/**", "tests/artifacts/**", "next-env.d.ts"] },
];
export default config;
