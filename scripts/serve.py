"""Static server for www/ on 127.0.0.1 with the right MIME types (wasm needs application/wasm)."""
import functools
import http.server
import sys

class Handler(http.server.SimpleHTTPRequestHandler):
    extensions_map = {
        **http.server.SimpleHTTPRequestHandler.extensions_map,
        ".wasm": "application/wasm", ".js": "text/javascript", ".mjs": "text/javascript",
        ".webmanifest": "application/manifest+json", ".bin": "application/octet-stream",
        ".svg": "image/svg+xml", ".css": "text/css", ".json": "application/json",
    }
    def end_headers(self):
        self.send_header("Cache-Control", "no-cache")
        super().end_headers()

def main():
    root = sys.argv[1] if len(sys.argv) > 1 else "www"
    port = int(sys.argv[2]) if len(sys.argv) > 2 else 8080
    handler = functools.partial(Handler, directory=root)
    with http.server.ThreadingHTTPServer(("127.0.0.1", port), handler) as httpd:
        httpd.serve_forever()

if __name__ == "__main__":
    main()
