# parsimetry: multi-stage image on Node 24, a maintained LTS line.
# (No Docker engine runs where this project is built; this file is kept correct
# by reading it against the README's install steps, not by building it there.)
# The code uses nothing that differs between Node 20.19 (engines, the machines
# the project is developed on) and 24: ES2022 output, node: built-ins only.

# --- build stage: every dependency (compilers for better-sqlite3's native addon,
# TypeScript for the build), compile src/ to dist/, then drop the dev dependencies.
FROM node:24-bookworm-slim AS build
WORKDIR /app
RUN apt-get update \
 && apt-get install -y --no-install-recommends python3 make g++ \
 && rm -rf /var/lib/apt/lists/*
COPY package.json package-lock.json tsconfig.json tsconfig.build.json ./
COPY src ./src
# `npm ci` runs `prepare`, which is the build (tsc -p tsconfig.build.json -> dist/).
RUN npm ci \
 && npm prune --omit=dev

# --- runtime stage: compiled JavaScript and production dependencies only, no
# compilers, no TypeScript loader, a non-root user, the audit file on a volume.
FROM node:24-bookworm-slim
ENV NODE_ENV=production \
    HOST=0.0.0.0 \
    PORT=8080 \
    AUDIT_DB=/app/data/audit.sqlite
WORKDIR /app
COPY --from=build /app/node_modules ./node_modules
COPY --from=build /app/dist ./dist
COPY package.json ./
RUN groupadd --system parsimetry \
 && useradd --system --gid parsimetry --home-dir /app parsimetry \
 && mkdir -p /app/data \
 && chown parsimetry:parsimetry /app/data
USER parsimetry
VOLUME ["/app/data"]
EXPOSE 8080
# SIGTERM starts the graceful shutdown (src/shutdown.ts): in-flight requests
# finish and commit their audit records within SHUTDOWN_GRACE_MS (20 s); give
# the orchestrator's stop timeout a little more than that (compose: stop_grace_period).
STOPSIGNAL SIGTERM
# HOST=0.0.0.0 needs API keys (API_KEYS_FILE): without them the service refuses
# to listen beyond loopback.
HEALTHCHECK --interval=15s --timeout=3s --start-period=20s --retries=3 \
  CMD node -e "fetch('http://127.0.0.1:'+(process.env.PORT||8080)+'/readyz').then(r=>process.exit(r.ok?0:1),()=>process.exit(1))"
CMD ["node", "dist/server.js"]
