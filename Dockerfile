# The service's image: compiled in a build stage with the development tools, run from a stage that
# holds the production dependencies, the compiled JavaScript and the workspace files only.
# Node 24: the newest release line the project runs on (CI smoke-tests 22 and 24); Node 20 is past
# its end of life.
ARG NODE_IMAGE=node:24-bookworm-slim

FROM ${NODE_IMAGE} AS build
WORKDIR /app
COPY package.json package-lock.json ./
# --ignore-scripts: `prepare` would compile before the sources are here; compiled below instead.
RUN npm ci --ignore-scripts --no-audit --no-fund
COPY tsconfig.json tsconfig.build.json ./
COPY server ./server
COPY kinds ./kinds
COPY schemas ./schemas
COPY reports ./reports
COPY migrations ./migrations
RUN npm run build

FROM ${NODE_IMAGE} AS runtime
ENV NODE_ENV=production \
    HOST=0.0.0.0 \
    PORT=3000 \
    RATEPROOF_DATA_DIR=/var/lib/rateproof
WORKDIR /app
COPY package.json package-lock.json ./
# Production dependencies only (the fonts the sheets use come with dejavu-fonts-ttf); --ignore-scripts
# skips `prepare`, which would compile, and no production dependency needs an install script.
RUN npm ci --omit=dev --ignore-scripts --no-audit --no-fund && npm cache clean --force
# The migrations are compiled into dist/migrations/ and applied at start-up.
COPY --from=build /app/dist ./dist
COPY bin ./bin
COPY web ./web
# The embedded database's folder, used only without DATABASE_URL (one process, a demo).
RUN mkdir -p /var/lib/rateproof && chown node:node /var/lib/rateproof
# The official Node images' unprivileged user: the service writes nothing under /app.
USER node
EXPOSE 3000
# Alive, not ready: a database restart must not mark every process unhealthy (compose waits on /ready).
HEALTHCHECK --interval=10s --timeout=5s --start-period=20s --retries=3 \
  CMD ["node", "dist/server/probe-cli.js", "/health"]
CMD ["node", "bin/rateproof.js", "serve"]
