import { Component, DestroyRef, ElementRef, afterNextRender, inject, input, output, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { TranslocoPipe } from '@jsverse/transloco';
import type { decodeLabel as DecodeLabel } from './decode-label';

/** Frames are shrunk to this width before decoding: a label filling a third of the view still has ~4 px per module. */
const DECODE_WIDTH = 480;
/** Decode at most this often; a low-end phone spends ~30 ms a frame, so the camera preview stays smooth. */
const DECODE_INTERVAL_MS = 120;

/** Why the camera cannot scan: the keys of the messages that send the person to typing the code. */
type LabelScannerProblem = 'ui.labelScanner.noCamera' | 'ui.labelScanner.cameraRefused';

/**
 * Opens the back camera and reads sample labels (QR codes) until one is found. Emits the code
 * once and stops the camera; the page decides whether the code may be used.
 */
@Component({
  selector: 'hs-label-scanner',
  imports: [MatButtonModule, MatIconModule, TranslocoPipe],
  template: `
    <div class="scanner" role="region" [attr.aria-label]="'ui.labelScanner.region' | transloco">
      @if (problem(); as problem) {
        <p class="problem" role="alert"><mat-icon aria-hidden="true">no_photography</mat-icon> {{ problem | transloco }}</p>
      } @else {
        <!-- The preview needs no captions: it shows the camera, and the status line below says what happens. -->
        <video #video class="preview" playsinline muted aria-hidden="true"></video>
        <p role="status" class="status">{{ hint() ?? ('ui.labelScanner.hint' | transloco) }}</p>
      }
      @if (notLabel(); as text) { <p class="problem" role="alert">{{ 'ui.labelScanner.notALabel' | transloco: { text } }}</p> }
      <button mat-stroked-button type="button" (click)="stopAndCancel()"><mat-icon aria-hidden="true">close</mat-icon> {{ 'ui.labelScanner.stop' | transloco }}</button>
    </div>
  `,
  styles: `
    .scanner { display: flex; flex-direction: column; gap: 8px; align-items: stretch; }
    .preview { width: 100%; max-height: 50vh; background: #000; border-radius: 12px; object-fit: cover; }
    .status { font-weight: 500; margin: 0; }
    .problem { display: flex; gap: 8px; align-items: center; color: var(--mat-sys-error); font-weight: 500; }
    button { min-height: 48px; align-self: flex-start; }
  `,
})
export class LabelScanner {
  /**
   * What to tell the person while the camera looks for a label, already in their language; without
   * one the scanner asks them to hold the label in the picture.
   */
  readonly hint = input<string | null>(null);
  /** The sample code read from a label. */
  readonly codeRead = output<string>();
  /** The person stopped scanning (or the camera could not start and they closed it). */
  readonly cancelled = output<void>();

  /** Why the camera cannot scan, as a translation key. */
  protected readonly problem = signal<LabelScannerProblem | null>(null);
  protected readonly notLabel = signal<string | null>(null);
  private readonly video = viewChild<ElementRef<HTMLVideoElement>>('video');
  private stream: MediaStream | null = null;
  private frameRequest = 0;
  private isStopped = false;

  constructor() {
    afterNextRender(() => void this.startCamera());
    inject(DestroyRef).onDestroy(() => this.stopCamera());
  }

  protected stopAndCancel(): void {
    this.stopCamera();
    this.cancelled.emit();
  }

  private async startCamera(): Promise<void> {
    if (!navigator.mediaDevices?.getUserMedia) {
      this.problem.set('ui.labelScanner.noCamera');
      return;
    }
    try {
      this.stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: { ideal: 'environment' } }, audio: false });
    } catch {
      this.problem.set('ui.labelScanner.cameraRefused');
      return;
    }
    const video = this.video()?.nativeElement;
    if (this.isStopped || !video) {
      this.stopCamera();
      return;
    }
    video.srcObject = this.stream;
    // The QR decoder loads only when someone scans, so the sample form itself opens fast on a slow phone.
    const [{ decodeLabel }] = await Promise.all([import('./decode-label'), video.play().catch(() => undefined)]);
    if (this.isStopped) return;
    this.scanFrames(video, decodeLabel);
  }

  /** Draws the preview into a small canvas and decodes it, a few times a second, until a label is read. */
  private scanFrames(video: HTMLVideoElement, decodeLabel: typeof DecodeLabel): void {
    const canvas = document.createElement('canvas');
    const context = canvas.getContext('2d', { willReadFrequently: true });
    let lastDecode = 0;
    const tick = (time: number) => {
      if (this.isStopped || !context) return;
      if (time - lastDecode >= DECODE_INTERVAL_MS && video.videoWidth > 0) {
        lastDecode = time;
        const scale = Math.min(1, DECODE_WIDTH / video.videoWidth);
        canvas.width = Math.round(video.videoWidth * scale);
        canvas.height = Math.round(video.videoHeight * scale);
        context.drawImage(video, 0, 0, canvas.width, canvas.height);
        const decoded = decodeLabel(context.getImageData(0, 0, canvas.width, canvas.height));
        if (decoded.status === 'code') {
          this.stopCamera();
          this.codeRead.emit(decoded.code);
          return;
        }
        this.notLabel.set(decoded.status === 'not-a-label' ? decoded.text : null);
      }
      this.frameRequest = requestAnimationFrame(tick);
    };
    this.frameRequest = requestAnimationFrame(tick);
  }

  private stopCamera(): void {
    this.isStopped = true;
    cancelAnimationFrame(this.frameRequest);
    this.stream?.getTracks().forEach((track) => track.stop());
    this.stream = null;
  }
}
