"""Layout measurements from a real browser, without any script in the page.

Chromium's DevTools protocol over a pipe (--remote-debugging-pipe: the browser reads commands on
fd 3 and writes replies on fd 4, each a JSON message ended by a NUL byte). The test sets the
viewport (Emulation.setDeviceMetricsOverride) and the media type (Emulation.setEmulatedMedia,
"print" for the print stylesheet), loads the page and asks for Page.getLayoutMetrics: the
browser's own figures for the document's content width and the layout viewport's width. A page
that scrolls sideways has a content width larger than the viewport. No script runs in the page.
"""
import base64
import json
import math
import os
import subprocess


class Browser:
    def __init__(self, chromium):
        to_child_r, self._to_child = os.pipe()
        self._from_child, from_child_w = os.pipe()

        def wire():
            # Move both ends out of the way first, so that neither is clobbered when it is already 3 or 4.
            a, b = os.dup2(to_child_r, 100), os.dup2(from_child_w, 101)
            os.dup2(a, 3)
            os.dup2(b, 4)

        self._proc = subprocess.Popen(
            [chromium, "--headless", "--no-sandbox", "--disable-gpu", "--remote-debugging-pipe",
             "--hide-scrollbars", "about:blank"],
            stdin=subprocess.DEVNULL, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
            preexec_fn=wire, pass_fds=(3, 4), close_fds=True)
        os.close(to_child_r)
        os.close(from_child_w)
        self._buffer = b""
        self._next = 0
        target = self.call("Target.createTarget", {"url": "about:blank"})["targetId"]
        self._session = self.call("Target.attachToTarget", {"targetId": target, "flatten": True})["sessionId"]
        self.call("Page.enable", session=True)

    def _read_message(self):
        while b"\0" not in self._buffer:
            chunk = os.read(self._from_child, 1 << 16)
            if not chunk:
                raise RuntimeError("chromium closed the DevTools pipe")
            self._buffer += chunk
        message, self._buffer = self._buffer.split(b"\0", 1)
        return json.loads(message)

    def call(self, method, params=None, session=False, wait_event=None):
        self._next += 1
        message = {"id": self._next, "method": method, "params": params or {}}
        if session:
            message["sessionId"] = self._session
        os.write(self._to_child, json.dumps(message).encode() + b"\0")
        result, seen_event = None, wait_event is None
        while result is None or not seen_event:
            reply = self._read_message()
            if reply.get("id") == self._next:
                if "error" in reply:
                    raise RuntimeError(f"{method}: {reply['error']}")
                result = reply.get("result", {})
            elif wait_event and reply.get("method") == wait_event:
                seen_event = True
        return result

    def layout(self, url, width, height, media="screen"):
        """(content width, viewport width) in CSS pixels for `url` at `width` x `height`."""
        self.call("Emulation.setDeviceMetricsOverride",
                  {"width": width, "height": height, "deviceScaleFactor": 1, "mobile": width <= 480},
                  session=True)
        self.call("Emulation.setEmulatedMedia", {"media": media}, session=True)
        self.call("Page.navigate", {"url": url}, session=True, wait_event="Page.loadEventFired")
        metrics = self.call("Page.getLayoutMetrics", session=True)
        return metrics["cssContentSize"]["width"], metrics["cssLayoutViewport"]["clientWidth"]

    def screenshot(self, path):
        """The viewport as PNG, as laid out by the last layout() call."""
        data = self.call("Page.captureScreenshot", {"format": "png"}, session=True)["data"]
        with open(path, "wb") as out:
            out.write(base64.b64decode(data))

    def full_page_screenshot(self, url, width, path):
        """The whole page at `width` CSS px as PNG: laid out once to learn the document's height, then
        the viewport is made that tall (so nothing is cut off below the fold) and captured."""
        self.layout(url, width, 800)
        metrics = self.call("Page.getLayoutMetrics", session=True)
        height = int(math.ceil(metrics["cssContentSize"]["height"]))
        self.call("Emulation.setDeviceMetricsOverride",
                  {"width": width, "height": height, "deviceScaleFactor": 1, "mobile": width <= 480},
                  session=True)
        self.screenshot(path)

    def close(self):
        try:
            self.call("Browser.close")
        except RuntimeError:
            pass
        os.close(self._to_child)
        os.close(self._from_child)
        try:
            self._proc.wait(timeout=30)
        except subprocess.TimeoutExpired:
            self._proc.kill()
            self._proc.wait()
