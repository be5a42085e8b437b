import next from "eslint-config-next";

const config = [
  {
    ignores: [
      ".next/**",
      ".next-test/**",
      ".next-bench/**",
      "node_modules/**",
      ".data/**",
      "db/migrations/**",
      "test-results/**",
      "next-env.d.ts",
    ],
  },
  ...next,
];

export default config;
