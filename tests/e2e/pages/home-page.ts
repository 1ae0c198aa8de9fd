import type { Locator, Page } from '@playwright/test';

export class HomePage {
  readonly designs: Locator;

  constructor(readonly page: Page) {
    this.designs = page.getByRole('region', { name: 'Designs' }).getByRole('listitem');
  }

  async open() {
    await this.page.goto('/');
  }

  design(name: string): Locator {
    return this.designs.filter({ has: this.page.getByRole('heading', { name, exact: true }) });
  }
}
