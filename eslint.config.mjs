import next from "eslint-config-next";

const config = [
  { ignores: [".next/**", ".next-test/**", "test-results/**", "node_modules/**", ".data/**", "bench-out/**", "next-env.d.ts", "db/migrations/**"] },
  ...next,
];

export default config;
