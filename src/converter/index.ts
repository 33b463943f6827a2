export * from './opamp-model';
export * from './component-value';
export * from './impedances';
export * from './gic-nonideal';
export * from './gic';
export * from './configurations';
