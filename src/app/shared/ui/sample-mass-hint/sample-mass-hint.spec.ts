import { TestBed } from '@angular/core/testing';
import { SampleMassHint } from './sample-mass-hint';

async function render(inputs: Record<string, unknown>) {
  const fixture = TestBed.createComponent(SampleMassHint);
  for (const [name, value] of Object.entries(inputs)) {
    fixture.componentRef.setInput(name, value);
  }
  fixture.detectChanges();
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

describe('SampleMassHint', () => {
  it('warns with the minimum mass when a coarse gold sample is far too small', async () => {
    const element = await render({ massKg: 0.5, topSizeMm: 10, liberationSizeMm: 0.1, gradeGpt: 1 });
    expect(element.textContent).toContain('Gy');
    expect(element.textContent).toMatch(/at least\s+[\d,.]+ kg/);
  });

  it('says nothing while the material is not described', async () => {
    const element = await render({ massKg: 0.5, topSizeMm: null, liberationSizeMm: 0.1, gradeGpt: 1 });
    expect(element.textContent?.trim()).toBe('');
  });

  it('says nothing when the sample is heavy enough', async () => {
    const element = await render({ massKg: 1000, topSizeMm: 0.1, liberationSizeMm: 0.1, gradeGpt: 5 });
    expect(element.textContent?.trim()).toBe('');
  });
});
