# The Meniscus server (and the device simulators, which docker-compose.yml's `demo` profile runs
# from the same image). Built by docker-compose.yml; runs as the unprivileged `node` user with its
# archive on a volume at /var/lib/meniscus.
FROM node:20-bookworm-slim

# better-sqlite3 compiles its native addon at install time.
RUN apt-get update \
  && apt-get install -y --no-install-recommends python3 make g++ \
  && rm -rf /var/lib/apt/lists/*

WORKDIR /opt/meniscus
COPY package.json package-lock.json ./
RUN npm ci --omit=dev
COPY server ./server
COPY simulators ./simulators
# The dashboard, built here (vite is a production dependency); the server serves web/dist at /.
COPY web ./web
RUN npm run build:web

RUN mkdir -p /var/lib/meniscus && chown node:node /var/lib/meniscus
ENV MENISCUS_DATA_DIR=/var/lib/meniscus \
    MENISCUS_HTTP_HOST=0.0.0.0 \
    MENISCUS_HTTP_PORT=8080
USER node
EXPOSE 8080
VOLUME ["/var/lib/meniscus"]
CMD ["node", "server/bin/meniscus-server.js"]
