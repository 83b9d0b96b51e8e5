#!/usr/bin/env node
// Draws Heapsight's own app icons (a flat-topped pile with a gold grain) into assets/icons.
// Run by hand when the mark changes: node scripts/make-icons.mjs. The PNGs are committed.
import { Jimp } from 'jimp';

const SIZE = 512;
const background = [0x7a, 0x2a, 0x0b];
const pile = [0xe8, 0xc9, 0x9a];
const pileShadow = [0xc9, 0xa2, 0x6b];
const gold = [0xff, 0xc8, 0x2e];
const goldEdge = [0x9a, 0x6a, 0x00];

const image = new Jimp({ width: SIZE, height: SIZE, color: 0xffffffff });
// Maskable icons keep their mark inside the central 80 % circle, so launchers may crop freely.
const paint = (x, y, [r, g, b]) => image.setPixelColor(((r << 24) | (g << 16) | (b << 8) | 0xff) >>> 0, x, y);

const baseY = 360;
const crestY = 190;
const baseHalf = 170;
const crestHalf = 60;
const goldX = 330;
const goldY = 150;
const goldR = 34;

for (let y = 0; y < SIZE; y += 1) {
  for (let x = 0; x < SIZE; x += 1) {
    let colour = background;
    if (y >= crestY && y <= baseY) {
      const t = (y - crestY) / (baseY - crestY);
      const half = crestHalf + t * (baseHalf - crestHalf);
      if (Math.abs(x - 256) <= half) {
        colour = x > 256 + half * 0.35 ? pileShadow : pile;
      }
    }
    const d = Math.hypot(x - goldX, y - goldY);
    if (d <= goldR) {
      colour = d > goldR - 6 ? goldEdge : gold;
    }
    if (y > baseY && y <= baseY + 10 && Math.abs(x - 256) <= baseHalf + 20) {
      colour = pileShadow;
    }
    paint(x, y, colour);
  }
}

const out = new URL('../assets/icons/', import.meta.url).pathname;
await image.write(`${out}icon-512.png`);
await image.clone().resize({ w: 192 }).write(`${out}icon-192.png`);
console.log('icons written to', out);
